// Inventory records as the forms, the routes and the spreadsheet import all validate them.
// Units: m for lengths and positions, flashes/km²/yr, days/yr, kA, °C, money in the organisation's currency.
import { z } from 'zod'
import { fitsNumeric, formatNumericMax, MONEY_NUMERIC, roundToScale } from './money'

// The engine's input contract uses these exact values (ComponentClass, TankMaterial, Contents, StructureKind).
export const TANK_MATERIALS = ['frp', 'polyethylene', 'steel', 'other'] as const
export const TANK_CONTENTS = ['crude', 'condensate', 'produced_water', 'fresh_water', 'chemical'] as const
export const COMPONENT_CLASSES = ['sharp_device', 'grounded_pipe', 'rounded_conductor', 'carbon_fibre'] as const
export const STRUCTURE_KINDS = ['mast', 'stack', 'ogw_support', 'building'] as const
export const GROUNDINGS = ['none', 'single', 'multiple'] as const

export type TankMaterial = (typeof TANK_MATERIALS)[number]
export type TankContents = (typeof TANK_CONTENTS)[number]
export type ComponentClass = (typeof COMPONENT_CLASSES)[number]
export type StructureKind = (typeof STRUCTURE_KINDS)[number]
export type Grounding = (typeof GROUNDINGS)[number]

export const MATERIAL_LABELS: Record<TankMaterial, string> = { frp: 'Fibreglass (FRP)', polyethylene: 'Polyethylene', steel: 'Steel', other: 'Other' }
export const CONTENTS_LABELS: Record<TankContents, string> = { crude: 'Crude oil', condensate: 'Condensate', produced_water: 'Produced water', fresh_water: 'Fresh water', chemical: 'Chemical' }
export const COMPONENT_LABELS: Record<ComponentClass, string> = {
  sharp_device: 'Sharp-edged device (float, gauge)',
  grounded_pipe: 'Grounded metal pipe',
  rounded_conductor: 'Rounded or enclosed conductor',
  carbon_fibre: 'Carbon-fibre part',
}
export const STRUCTURE_LABELS: Record<StructureKind, string> = { mast: 'Mast', stack: 'Stack', ogw_support: 'Overhead ground wire support', building: 'Building' }
export const GROUNDING_LABELS: Record<Grounding, string> = { none: 'None', single: 'Single point', multiple: 'Multiple points' }

const text = (max: number) => z.string().trim().max(max, `Keep it under ${max} characters.`)
const requiredText = (what: string, max = 100) => z.string({ error: `Enter ${what}.` }).trim().min(1, `Enter ${what}.`).max(max, `Keep it under ${max} characters.`)
const num = (what: string) => z.number({ error: `Enter ${what} as a number.` }).refine(Number.isFinite, `Enter ${what} as a number.`)
/** Money: non-negative, rounded to cents as the database stores it, and no more than its numeric(14,2) column holds. */
const money = (what: string) => {
  const What = `${what[0]!.toUpperCase()}${what.slice(1)}`
  return num(what).min(0, `${What} cannot be negative.`).transform(v => roundToScale(v, MONEY_NUMERIC.inventory.scale))
    .refine(v => fitsNumeric(v, MONEY_NUMERIC.inventory), `${What} is above ${formatNumericMax(MONEY_NUMERIC.inventory)}, the largest amount stored.`)
}
const length = (what: string, max: number) => num(what).gt(0, `${what[0]!.toUpperCase()}${what.slice(1)} must be above 0 m.`).max(max, `${what[0]!.toUpperCase()}${what.slice(1)} must be at most ${max} m.`)
const position = (axis: 'x' | 'y') => num(`the ${axis} position in metres`).min(-5000, 'Positions lie within 5,000 m of the site reference point.').max(5000, 'Positions lie within 5,000 m of the site reference point.')

export const siteSchema = z.object({
  externalId: requiredText('the site reference'),
  name: requiredText('a site name', 200),
  operatorName: text(200).default(''),
  latitudeDeg: num('the latitude in degrees').min(-90, 'Latitude lies between −90° and 90°.').max(90, 'Latitude lies between −90° and 90°.'),
  longitudeDeg: num('the longitude in degrees').min(-180, 'Longitude lies between −180° and 180°.').max(180, 'Longitude lies between −180° and 180°.'),
  flashDensityPerKm2Yr: num('the ground flash density').gt(0, 'Ground flash density must be above 0 flashes/km²/yr.').max(100, 'Ground flash density above 100 flashes/km²/yr is not plausible.').nullable().default(null),
  thunderstormDaysPerYr: num('the thunderstorm days').gt(0, 'Thunderstorm days must be above 0 days/yr.').max(366, 'A year has at most 366 thunderstorm days.').nullable().default(null),
  locationNotes: text(2000).default(''),
  insuredPropertyValue: money('the insured property value').nullable().default(null),
  insuredInterruptionValue: money('the insured interruption value').nullable().default(null),
}).superRefine((site, ctx) => {
  const given = (site.flashDensityPerKm2Yr !== null ? 1 : 0) + (site.thunderstormDaysPerYr !== null ? 1 : 0)
  if (given !== 1) {
    const message = given === 0
      ? 'Enter the ground flash density (flashes/km²/yr) or the thunderstorm days (days/yr).'
      : 'Enter the ground flash density or the thunderstorm days, not both.'
    ctx.addIssue({ code: 'custom', path: ['flashDensityPerKm2Yr'], message })
    ctx.addIssue({ code: 'custom', path: ['thunderstormDaysPerYr'], message })
  }
})
export type SiteInput = z.input<typeof siteSchema>
export type SiteRecord = z.output<typeof siteSchema>

export const componentSchema = z.object({
  componentClass: z.enum(COMPONENT_CLASSES, { error: 'Choose a component class.' }),
  count: z.number({ error: 'Enter the count as a whole number.' }).int('Enter the count as a whole number.').min(1, 'Count must be at least 1.').max(1000, 'Count must be at most 1,000.'),
  heightM: length('component height', 100),
})
export type ComponentRecord = z.output<typeof componentSchema>

export const tankSchema = z.object({
  externalId: requiredText('the tank reference'),
  tag: requiredText('the tank tag', 60),
  material: z.enum(TANK_MATERIALS, { error: `Choose a material: ${TANK_MATERIALS.join(', ')}.` }),
  heightM: length('height', 100),
  diameterM: length('diameter', 200),
  xM: position('x'),
  yM: position('y'),
  contents: z.enum(TANK_CONTENTS, { error: `Choose the contents: ${TANK_CONTENTS.join(', ')}.` }),
  flammableVapourSpace: z.boolean({ error: 'Say whether a flammable vapour space is usual (yes or no).' }),
  chemicalFlashPointC: num('the flash point in °C').min(-100, 'Flash point lies between −100 °C and 400 °C.').max(400, 'Flash point lies between −100 °C and 400 °C.').nullable().default(null),
  grounding: z.enum(GROUNDINGS, { error: `Choose the grounding: ${GROUNDINGS.join(', ')}.` }).default('single'),
  shieldRatingKa: num('the shield rating in kA').gt(0, 'Shield rating must be above 0 kA (leave it empty when there is no shield).').max(500, 'Shield rating must be at most 500 kA.').nullable().default(null),
  vapourControl: z.boolean().default(false),
  staticDissipator: z.boolean().default(false),
  bondingUpgrade: z.boolean().default(false),
  replacementValue: money('the replacement value').default(0),
  contentsValue: money('the contents value').default(0),
  cleanupCost: money('the clean-up cost').default(0),
  interruptionCost: money('the interruption cost').default(0),
  components: z.array(componentSchema).max(COMPONENT_CLASSES.length).default([]),
}).superRefine((tank, ctx) => {
  const seen = new Set<string>()
  tank.components.forEach((c, i) => {
    if (seen.has(c.componentClass)) ctx.addIssue({ code: 'custom', path: ['components', i, 'componentClass'], message: 'Each component class appears once; add to its count instead.' })
    seen.add(c.componentClass)
    if (tank.heightM > 0 && c.heightM > tank.heightM) ctx.addIssue({ code: 'custom', path: ['components', i, 'heightM'], message: `Component height (${c.heightM} m) cannot exceed the tank height (${tank.heightM} m).` })
  })
  if (tank.chemicalFlashPointC !== null && tank.contents !== 'chemical') {
    ctx.addIssue({ code: 'custom', path: ['chemicalFlashPointC'], message: 'A flash point is only recorded for chemical contents.' })
  }
})
export type TankInput = z.input<typeof tankSchema>
export type TankRecord = z.output<typeof tankSchema>

export const structureSchema = z.object({
  externalId: requiredText('the structure reference'),
  kind: z.enum(STRUCTURE_KINDS, { error: `Choose a kind: ${STRUCTURE_KINDS.join(', ')}.` }),
  label: text(200).default(''),
  xM: position('x'),
  yM: position('y'),
  heightM: length('height', 500),
  radiusM: length('radius', 200),
})
export type StructureInput = z.input<typeof structureSchema>
export type StructureRecord = z.output<typeof structureSchema>

export const portfolioSchema = z.object({
  name: requiredText('a portfolio name', 200),
  description: text(2000).default(''),
})
export type PortfolioInput = z.input<typeof portfolioSchema>

export const portfolioSitesSchema = z.object({
  add: z.array(z.uuid()).max(10_000).default([]),
  remove: z.array(z.uuid()).max(10_000).default([]),
})

export const portfolioShareSchema = z.object({
  organisationName: requiredText('the name of the organisation to share with', 200),
})

export const SITE_SORTS = ['name', 'externalId', 'operatorName', 'flashDensity', 'tankCount', 'updatedAt'] as const
export const siteListQuerySchema = z.object({
  q: z.string().trim().max(200).optional(),
  operator: z.string().trim().max(200).optional(),
  portfolioId: z.uuid().optional(),
  sort: z.enum(SITE_SORTS).default('name'),
  dir: z.enum(['asc', 'desc']).default('asc'),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
})
export type SiteListQuery = z.output<typeof siteListQuerySchema>
