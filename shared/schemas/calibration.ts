// Calibration forms and routes share these schemas (messages shown by the field).
import { z } from 'zod'
import { IMPULSE_LIMITS } from '../calibration/impulse-records'
import { IEC_MINIMUM_USEFUL_APPLICATIONS } from '../calibration/up-and-down'

export const COMPONENT_CLASS_OPTIONS = [
  { value: 'sharp_device', label: 'Sharp-edged device (float, gauge with points)' },
  { value: 'grounded_pipe', label: 'Grounded metal pipe' },
  { value: 'rounded_conductor', label: 'Rounded or enclosed conductor' },
  { value: 'carbon_fibre', label: 'Carbon-fibre part' },
] as const
export const componentClassSchema = z.enum(['sharp_device', 'grounded_pipe', 'rounded_conductor', 'carbon_fibre'], { error: 'Choose a component class.' })

const title = z.string({ error: 'Give the calibration a title.' }).trim().min(1, 'Give the calibration a title.').max(200, 'Keep the title under 200 characters.')
const uuid = (what: string) => z.uuid({ error: `Choose ${what}.` })

export const lightningCalibrationSchema = z.object({
  title,
  fileId: uuid('an uploaded file'),
  siteIds: z.array(z.uuid(), { error: 'Choose at least one site.' }).min(1, 'Choose at least one site.').max(500, 'Choose at most 500 sites at a time.'),
  radiusKm: z.number({ error: 'Enter the radius in km.' }).min(0.5, 'The radius must be at least 0.5 km.').max(100, 'The radius must be at most 100 km.'),
  detectionEfficiency: z.number({ error: 'Enter the detection efficiency.' }).gt(0, 'The detection efficiency must be above 0.').max(1, 'The detection efficiency is a share: at most 1 (100 %).'),
  thresholdKa: z.number({ error: 'Enter the detection threshold in kA (0 if none).' }).min(0, 'The threshold cannot be negative.').max(100, 'A detection threshold above 100 kA would leave almost no records.'),
  recordsAre: z.enum(['flashes', 'strokes'], { error: 'Say whether the records are flashes or strokes.' }),
  /** Years of records; empty = the span from the first to the last record. */
  periodYears: z.number().gt(0, 'The record period must be above 0 years.').max(200).nullable().default(null),
  maxLocationErrorKm: z.number().gt(0, 'The location error limit must be above 0 km.').max(100).nullable().default(null),
})
export type LightningCalibrationInput = z.infer<typeof lightningCalibrationSchema>

const latitude = (label: string) => z.number({ error: `Enter the ${label} latitude in decimal degrees.` }).min(-90, 'A latitude lies between −90° and 90°.').max(90, 'A latitude lies between −90° and 90°.')
const longitude = (label: string) => z.number({ error: `Enter the ${label} longitude in decimal degrees.` }).min(-180, 'A longitude lies between −180° and 180°.').max(180, 'A longitude lies between −180° and 180°.')

/** Bootstrap refits one calibration may ask for (each is a full simulation and fit of the records' windows). */
export const STORM_CLUSTERING_MAX_BOOTSTRAP = 99

export const stormClusteringCalibrationSchema = z.object({
  title,
  fileId: uuid('an uploaded file'),
  /** The region (a latitude/longitude box); empty = the records' extent. */
  box: z.object({ minLat: latitude('southern'), maxLat: latitude('northern'), minLon: longitude('western'), maxLon: longitude('eastern') })
    .refine(b => b.maxLat > b.minLat, { message: 'The northern edge must lie north of the southern edge.', path: ['maxLat'] })
    .refine(b => b.maxLon > b.minLon, { message: 'The eastern edge must lie east of the western edge (boxes across the 180° meridian are not supported).', path: ['maxLon'] })
    .refine(b => b.maxLat - b.minLat <= 15 && b.maxLon - b.minLon <= 15, { message: 'Keep the region within 15° on each side (the local projection holds for regions up to about 1,500 km).', path: ['maxLon'] })
    .nullable().default(null),
  windowHours: z.number({ error: 'Enter the length of a time window in hours.' }).min(1, 'A time window is at least 1 hour.').max(168, 'A time window is at most 168 hours (a week).').default(24),
  detectionEfficiency: z.number({ error: 'Enter the detection efficiency.' }).gt(0, 'The detection efficiency must be above 0.').max(1, 'The detection efficiency is a share: at most 1 (100 %).'),
  recordsAre: z.enum(['flashes', 'strokes'], { error: 'Say whether the records are flashes or strokes.' }),
  periodYears: z.number().gt(0, 'The record period must be above 0 years.').max(200).nullable().default(null),
  maxLocationErrorKm: z.number().gt(0, 'The location error limit must be above 0 km.').max(100).nullable().default(null),
  bootstrap: z.number({ error: 'Enter the number of bootstrap refits.' }).int('The number of bootstrap refits is a whole number.').min(19, 'At least 19 bootstrap refits are needed for a 95 % percentile interval.').max(STORM_CLUSTERING_MAX_BOOTSTRAP, `At most ${STORM_CLUSTERING_MAX_BOOTSTRAP} bootstrap refits per calibration.`).default(49),
})
export type StormClusteringCalibrationInput = z.infer<typeof stormClusteringCalibrationSchema>

export const impulseApplicationSchema = z.object({
  levelKv: z.number({ error: 'Each level must be a voltage in kV.' }).gt(0, 'Each level must be above 0 kV.').max(10_000, 'Each level must be at most 10 000 kV.'),
  spark: z.boolean({ error: 'Say for each application whether it sparked.' }),
})

export const impulseCalibrationSchema = z.object({
  title,
  componentClass: componentClassSchema,
  configuration: z.string().trim().min(1, 'Describe the test configuration (object, gap, waveshape, polarity).').max(1000),
  /** Field potential per unit of test level: U50 in the field = factor × U50 in the test. */
  equivalenceFactor: z.number({ error: 'Enter the equivalence factor.' }).gt(0, 'The equivalence factor must be above 0.').max(100, 'The equivalence factor must be at most 100.'),
  equivalenceBasis: z.string().trim().min(1, 'Say where the equivalence factor comes from (e.g. "1: test waveshape taken as the induced one").').max(1000),
  minimumUseful: z.number().int().min(IEC_MINIMUM_USEFUL_APPLICATIONS, `At least ${IEC_MINIMUM_USEFUL_APPLICATIONS} useful applications (IEC 60060-1).`).max(1000).default(IEC_MINIMUM_USEFUL_APPLICATIONS),
  series: z.array(impulseApplicationSchema).min(1, 'The series is empty: enter the applied levels and whether each one sparked.').max(IMPULSE_LIMITS.maxRows),
  /** The uploaded file, when the series came from one unchanged. */
  source: z.object({ fileName: z.string().trim().min(1).max(200), text: z.string().max(IMPULSE_LIMITS.maxBytes) }).nullable().default(null),
})
export type ImpulseCalibrationInput = z.infer<typeof impulseCalibrationSchema>

export const applyToAssumptionsSchema = z.object({
  assumptionVersionId: uuid('the assumption-set version to start from'),
  note: z.string().trim().max(1000).default(''),
  /** Impulse: which U50 to use; σ always comes from maximum likelihood. */
  method: z.enum(['likelihood', 'up_and_down']).default('likelihood'),
})

export const applyToSitesSchema = z.object({
  siteIds: z.array(z.uuid()).min(1, 'Choose at least one site.').max(500),
})
