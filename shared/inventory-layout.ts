// The inventory workbook layout: sheets Sites, Tanks and Structures, one header row of column names
// that carry their unit, one record per row. The template, the export and the import all read it.
import { COMPONENT_CLASSES, GROUNDINGS, STRUCTURE_KINDS, TANK_CONTENTS, TANK_MATERIALS } from './schemas/inventory'

export type CellKind = 'text' | 'number' | 'integer' | 'boolean' | 'enum'

export interface ColumnSpec {
  /** Header text, e.g. `height_m`. */
  header: string
  /** Field of the record (dotted for tank components, e.g. `components.sharp_device.count`). */
  field: string
  kind: CellKind
  required: boolean
  /** Unit words for messages, e.g. 'metres (m)'. */
  unit?: string
  values?: readonly string[]
  note: string
  width?: number
}

export type SheetName = 'Sites' | 'Tanks' | 'Structures'
export const SHEET_NAMES: SheetName[] = ['Sites', 'Tanks', 'Structures']

export const MAX_IMPORT_BYTES = 10 * 1024 * 1024
export const MAX_IMPORT_ROWS = 50_000

const M = 'metres (m)'
const MONEY = 'the organisation\'s currency'

export const SITE_COLUMNS: ColumnSpec[] = [
  { header: 'site_external_id', field: 'externalId', kind: 'text', required: true, note: 'Your reference for the site; rows are matched on it when a file is imported again.', width: 18 },
  { header: 'name', field: 'name', kind: 'text', required: true, note: 'Site name.', width: 28 },
  { header: 'operator', field: 'operatorName', kind: 'text', required: false, note: 'Whose site it is.', width: 24 },
  { header: 'latitude_deg', field: 'latitudeDeg', kind: 'number', required: true, unit: 'decimal degrees (°), north positive', note: 'Latitude in decimal degrees, −90 to 90 (north positive).', width: 14 },
  { header: 'longitude_deg', field: 'longitudeDeg', kind: 'number', required: true, unit: 'decimal degrees (°), east positive', note: 'Longitude in decimal degrees, −180 to 180 (east positive).', width: 14 },
  { header: 'flash_density_per_km2_yr', field: 'flashDensityPerKm2Yr', kind: 'number', required: false, unit: 'flashes/km²/yr', note: 'Ground flash density Ng in flashes per km² per year. Fill this OR thunderstorm_days_per_yr, not both.', width: 16 },
  { header: 'thunderstorm_days_per_yr', field: 'thunderstormDaysPerYr', kind: 'number', required: false, unit: 'days/yr', note: 'Thunderstorm days per year (Td); Ng is derived from it. Fill this OR flash_density_per_km2_yr.', width: 16 },
  { header: 'insured_property_value', field: 'insuredPropertyValue', kind: 'number', required: false, unit: MONEY, note: 'Insured property value of the site, in the organisation\'s currency (optional).', width: 16 },
  { header: 'insured_interruption_value', field: 'insuredInterruptionValue', kind: 'number', required: false, unit: MONEY, note: 'Insured business-interruption value, in the organisation\'s currency (optional).', width: 16 },
  { header: 'location_notes', field: 'locationNotes', kind: 'text', required: false, note: 'Directions, access, anything that locates the site.', width: 30 },
]

const componentColumns: ColumnSpec[] = COMPONENT_CLASSES.flatMap(c => [
  { header: `${c}_count`, field: `components.${c}.count`, kind: 'integer' as const, required: false, note: `Number of ${c.replace(/_/g, ' ')} components inside the tank (whole number; empty or 0 = none).`, width: 12 },
  { header: `${c}_height_m`, field: `components.${c}.heightM`, kind: 'number' as const, required: false, unit: M, note: `Height of the tallest ${c.replace(/_/g, ' ')} component above the tank floor, in metres; needed when the count is above 0.`, width: 12 },
])

export const TANK_COLUMNS: ColumnSpec[] = [
  { header: 'site_external_id', field: 'siteExternalId', kind: 'text', required: true, note: 'The site the tank stands on (its site_external_id on the Sites sheet or in the inventory).', width: 18 },
  { header: 'tank_external_id', field: 'externalId', kind: 'text', required: true, note: 'Your reference for the tank, unique within its site; rows are matched on it.', width: 18 },
  { header: 'tag', field: 'tag', kind: 'text', required: true, note: 'Tank tag as painted on site, unique within the site.', width: 12 },
  { header: 'material', field: 'material', kind: 'enum', required: true, values: TANK_MATERIALS, note: `Shell material: ${TANK_MATERIALS.join(', ')}.`, width: 14 },
  { header: 'height_m', field: 'heightM', kind: 'number', required: true, unit: M, note: 'Shell height in metres (above 0).', width: 10 },
  { header: 'diameter_m', field: 'diameterM', kind: 'number', required: true, unit: M, note: 'Shell diameter in metres (above 0).', width: 10 },
  { header: 'x_m', field: 'xM', kind: 'number', required: true, unit: M, note: 'Position of the tank axis, metres east of the site reference point (negative = west).', width: 9 },
  { header: 'y_m', field: 'yM', kind: 'number', required: true, unit: M, note: 'Position of the tank axis, metres north of the site reference point (negative = south).', width: 9 },
  { header: 'contents', field: 'contents', kind: 'enum', required: true, values: TANK_CONTENTS, note: `What the tank holds: ${TANK_CONTENTS.join(', ')}.`, width: 16 },
  { header: 'flammable_vapour_space', field: 'flammableVapourSpace', kind: 'boolean', required: true, note: 'yes if a flammable vapour space is usual above the liquid, otherwise no.', width: 12 },
  { header: 'chemical_flash_point_c', field: 'chemicalFlashPointC', kind: 'number', required: false, unit: 'degrees Celsius (°C)', note: 'Flash point in °C, for chemical contents only.', width: 12 },
  { header: 'grounding', field: 'grounding', kind: 'enum', required: true, values: GROUNDINGS, note: `Grounding: ${GROUNDINGS.join(', ')}. Recorded only: grounding does not prevent induced sparking.`, width: 12 },
  { header: 'shield_rating_ka', field: 'shieldRatingKa', kind: 'number', required: false, unit: 'kiloamperes (kA)', note: 'Rating of an installed induced-sparking shield in kA; empty when there is none.', width: 12 },
  { header: 'vapour_control', field: 'vapourControl', kind: 'boolean', required: true, note: 'yes if a vapour control is installed, otherwise no.', width: 10 },
  { header: 'static_dissipator', field: 'staticDissipator', kind: 'boolean', required: true, note: 'yes if a static dissipator is installed (recorded only), otherwise no.', width: 10 },
  { header: 'bonding_upgrade', field: 'bondingUpgrade', kind: 'boolean', required: true, note: 'yes if bonding was upgraded (recorded only), otherwise no.', width: 10 },
  { header: 'replacement_value', field: 'replacementValue', kind: 'number', required: true, unit: MONEY, note: 'Cost to replace the tank, in the organisation\'s currency.', width: 14 },
  { header: 'contents_value', field: 'contentsValue', kind: 'number', required: true, unit: MONEY, note: 'Value of the usual contents, in the organisation\'s currency.', width: 14 },
  { header: 'cleanup_cost', field: 'cleanupCost', kind: 'number', required: true, unit: MONEY, note: 'Clean-up cost after a fire, in the organisation\'s currency.', width: 14 },
  { header: 'interruption_cost', field: 'interruptionCost', kind: 'number', required: true, unit: MONEY, note: 'Business-interruption cost after a fire, in the organisation\'s currency.', width: 14 },
  ...componentColumns,
]

export const STRUCTURE_COLUMNS: ColumnSpec[] = [
  { header: 'site_external_id', field: 'siteExternalId', kind: 'text', required: true, note: 'The site the structure stands on.', width: 18 },
  { header: 'structure_external_id', field: 'externalId', kind: 'text', required: true, note: 'Your reference for the structure, unique within its site; rows are matched on it.', width: 20 },
  { header: 'kind', field: 'kind', kind: 'enum', required: true, values: STRUCTURE_KINDS, note: `Kind: ${STRUCTURE_KINDS.join(', ')} (ogw_support = overhead ground wire support).`, width: 14 },
  { header: 'label', field: 'label', kind: 'text', required: false, note: 'A short description.', width: 24 },
  { header: 'x_m', field: 'xM', kind: 'number', required: true, unit: M, note: 'Metres east of the site reference point.', width: 9 },
  { header: 'y_m', field: 'yM', kind: 'number', required: true, unit: M, note: 'Metres north of the site reference point.', width: 9 },
  { header: 'height_m', field: 'heightM', kind: 'number', required: true, unit: M, note: 'Height in metres (above 0).', width: 10 },
  { header: 'radius_m', field: 'radiusM', kind: 'number', required: true, unit: M, note: 'Radius of the footprint in metres (above 0; a mast ≈ 0.5 m).', width: 10 },
]

export const SHEET_COLUMNS: Record<SheetName, ColumnSpec[]> = { Sites: SITE_COLUMNS, Tanks: TANK_COLUMNS, Structures: STRUCTURE_COLUMNS }
