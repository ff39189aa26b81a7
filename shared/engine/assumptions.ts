// The assumption set: every parameter of the model in one typed object, with its unit, default and
// source (MODEL.md). Runs store the full, validated set they used.
import { z } from 'zod'
import type { AttachmentModel, ComponentClass, Contents } from './types'
import type { FlashDensityFormula } from './flash-density'
import { SPEED_OF_LIGHT_M_PER_S } from './induction'
import type { DamageRatio, FireSpread, LossComponent } from './loss'
import { fieldMessages, type FieldMessages } from '../schemas/messages'
import { assumptionUncertaintySchema, type AssumptionUncertainty } from './uncertainty-types'
import { illustrativeUncertainty } from './uncertainty-defaults'
import { assumptionValueAt, FLASH_DENSITY_FACTOR_LABEL, FLASH_DENSITY_FACTOR_PATH, uncertaintyIssues, type PathDescription } from './uncertainty-ranges'

export type CurrentLawKind = 'power_law' | 'lognormal' | 'empirical'
export type SparkContents = Exclude<Contents, 'chemical'>

export interface ComponentThreshold { u50Kv: number; sigma: number }

export interface AssumptionSet {
  attachmentModel: AttachmentModel
  currentLaw: CurrentLawKind
  powerLawMedianKa: number
  powerLawExponent: number
  lognormalMedianKa: number
  lognormalBeta: number
  empiricalCurrentsKa: number[]
  currentMinKa: number
  currentMaxKa: number
  strikingDistanceA: number
  strikingDistanceB: number
  groundStrikingFactor: number
  returnStrokeVelocity: number
  couplingOverride: number | null
  thresholds: Record<ComponentClass, ComponentThreshold>
  ignitionGivenSpark: Record<SparkContents, number>
  chemicalFlashPointLimitC: number
  ignitionGivenSparkChemicalBelowLimit: number
  ignitionGivenSparkChemicalAboveLimit: number
  ignitionGivenDirectNonConducting: number
  ignitionGivenDirectSteel: number
  vapourControlFactor: number
  /** Damage ratio per loss component: mean and standard deviation of a beta distribution on [0, 1]. */
  damageRatio: Record<LossComponent, DamageRatio>
  fireSpread: FireSpread
  flashDensityFormula: FlashDensityFormula
  cutoffProbability: number
  /** Simulated years with storm clustering: storms' Gaussian spread σ (km) and mean ground flashes per storm. */
  stormClustering: StormClustering
  /** How far each numeric assumption is known (used by runs with assumption draws only). */
  uncertainty: AssumptionUncertainty
}

export interface StormClustering { spreadKm: number; flashesPerStorm: number }

export type DeepPartial<T> = T extends readonly unknown[] ? T : T extends object ? { [K in keyof T]?: DeepPartial<T[K]> } : T
export type AssumptionSetInput = DeepPartial<AssumptionSet>

const ILLUSTRATIVE = 'illustrative default — calibrate'

export const defaultAssumptions: Readonly<AssumptionSet> = Object.freeze({
  attachmentModel: 'egm',
  currentLaw: 'power_law',
  powerLawMedianKa: 31,
  powerLawExponent: 2.6,
  lognormalMedianKa: 31.1,
  lognormalBeta: 0.484,
  empiricalCurrentsKa: [],
  currentMinKa: 2,
  currentMaxKa: 400,
  strikingDistanceA: 10,
  strikingDistanceB: 0.65,
  groundStrikingFactor: 1,
  returnStrokeVelocity: 1.2e8,
  couplingOverride: null,
  thresholds: {
    sharp_device: { u50Kv: 70, sigma: 0.3 },
    grounded_pipe: { u50Kv: 100, sigma: 0.3 },
    rounded_conductor: { u50Kv: 140, sigma: 0.3 },
    carbon_fibre: { u50Kv: 90, sigma: 0.3 },
  },
  ignitionGivenSpark: { crude: 0.3, condensate: 0.4, produced_water: 0.1, fresh_water: 0 },
  chemicalFlashPointLimitC: 60,
  ignitionGivenSparkChemicalBelowLimit: 0.4,
  ignitionGivenSparkChemicalAboveLimit: 0.02,
  ignitionGivenDirectNonConducting: 0.5,
  ignitionGivenDirectSteel: 0.02,
  vapourControlFactor: 0.3,
  damageRatio: {
    replacement: { mean: 0.7, sd: 0.25 },
    contents: { mean: 0.8, sd: 0.25 },
    cleanup: { mean: 0.6, sd: 0.3 },
    interruption: { mean: 0.6, sd: 0.3 },
  },
  fireSpread: { model: 'exponential', probabilityAtContact: 0.25, decayLengthM: 5, maxDistanceM: 25 },
  flashDensityFormula: 'anderson',
  cutoffProbability: 1e-6,
  stormClustering: { spreadKm: 10, flashesPerStorm: 1000 },
  uncertainty: illustrativeUncertainty(),
} satisfies AssumptionSet)

export interface AssumptionParameterMeta {
  /** Dotted path into the assumption set, e.g. `thresholds.sharp_device.u50Kv`. */
  key: string
  label: string
  /** Unit text for display; '' for dimensionless values and choices. */
  unit: string
  default: number | string | number[] | null
  source: string
  kind: 'number' | 'choice' | 'number_list' | 'optional_number'
  options?: readonly string[]
}

const CLASS_LABELS: Record<ComponentClass, string> = {
  sharp_device: 'sharp-edged devices (floats, gauges with points)',
  grounded_pipe: 'grounded metal pipe',
  rounded_conductor: 'rounded or enclosed conductor',
  carbon_fibre: 'carbon-fibre part',
}

const CONTENTS_LABELS: Record<SparkContents, string> = {
  crude: 'crude oil', condensate: 'condensate', produced_water: 'produced water (oil carry-over)', fresh_water: 'fresh water',
}

function thresholdMeta(): AssumptionParameterMeta[] {
  return (Object.keys(CLASS_LABELS) as ComponentClass[]).flatMap((cls) => [
    { key: `thresholds.${cls}.u50Kv`, label: `50 % sparking level, ${CLASS_LABELS[cls]}`, unit: 'kV', default: defaultAssumptions.thresholds[cls].u50Kv, source: `${ILLUSTRATIVE} (Methodology §4); impulse-test calibration replaces it`, kind: 'number' as const },
    { key: `thresholds.${cls}.sigma`, label: `Sparking scatter, log-normal σ, ${CLASS_LABELS[cls]}`, unit: 'dimensionless', default: defaultAssumptions.thresholds[cls].sigma, source: `${ILLUSTRATIVE} (Methodology §4)`, kind: 'number' as const },
  ])
}

function ignitionMeta(): AssumptionParameterMeta[] {
  return (Object.keys(CONTENTS_LABELS) as SparkContents[]).map((c) => ({
    key: `ignitionGivenSpark.${c}`, label: `Ignition given a spark, ${CONTENTS_LABELS[c]}`, unit: 'probability',
    default: defaultAssumptions.ignitionGivenSpark[c], source: `${ILLUSTRATIVE} (Methodology §4)`, kind: 'number' as const,
  }))
}

const LOSS_LABELS: Record<LossComponent, string> = {
  replacement: 'replacement (property damage)', contents: 'contents (property damage)', cleanup: 'clean-up (property damage)', interruption: 'interruption (business interruption)',
}

function damageRatioMeta(): AssumptionParameterMeta[] {
  return (Object.keys(LOSS_LABELS) as LossComponent[]).flatMap((c) => [
    { key: `damageRatio.${c}.mean`, label: `Damage ratio given fire, mean, ${LOSS_LABELS[c]}`, unit: 'share of value (0–1)', default: defaultAssumptions.damageRatio[c].mean, source: `${ILLUSTRATIVE}; beta distribution on [0, 1] (Methodology §4)`, kind: 'number' as const },
    { key: `damageRatio.${c}.sd`, label: `Damage ratio given fire, standard deviation, ${LOSS_LABELS[c]}`, unit: 'share of value (0–1)', default: defaultAssumptions.damageRatio[c].sd, source: `${ILLUSTRATIVE}; must stay below √(mean·(1 − mean))`, kind: 'number' as const },
  ])
}

/** Basis of the spread defaults, as the product states it. */
const SPREAD_BASIS = 'from memory: flammable-liquid tank spacing practice (NFPA 30 shell-to-shell spacing of about one sixth of the sum of the two diameters, at least 0.9 m) expects a neighbour one spacing away to be exposed but not usually lost; common practice treats spread beyond about one diameter as rare'

/** One row per parameter, in form order, so the UI can render a form and an assumption-set comparison. */
export const assumptionParameterMeta: readonly AssumptionParameterMeta[] = Object.freeze([
  { key: 'attachmentModel', label: 'Attachment rule', unit: '', default: 'egm', kind: 'choice', options: ['egm', 'collection_area'], source: 'Electrogeometric model, rolling-sphere form of IEC 62305-1 (Methodology §2); option: IEC 62305-2 collection area (3H)' },
  { key: 'currentLaw', label: 'Peak-current distribution', unit: '', default: 'power_law', kind: 'choice', options: ['power_law', 'lognormal', 'empirical'], source: 'IEEE Std 1410 power law (Anderson & Eriksson); CIGRE log-normal; empirical from records (Methodology §1)' },
  { key: 'powerLawMedianKa', label: 'Power law: median current', unit: 'kA', default: 31, kind: 'number', source: 'IEEE Std 1410 (Anderson & Eriksson 1980)' },
  { key: 'powerLawExponent', label: 'Power law: exponent', unit: '', default: 2.6, kind: 'number', source: 'IEEE Std 1410 (Anderson & Eriksson 1980)' },
  { key: 'lognormalMedianKa', label: 'Log-normal: median current', unit: 'kA', default: 31.1, kind: 'number', source: 'CIGRE first negative strokes (Anderson & Eriksson 1980)' },
  { key: 'lognormalBeta', label: 'Log-normal: log standard deviation β', unit: '', default: 0.484, kind: 'number', source: 'CIGRE first negative strokes (Anderson & Eriksson 1980)' },
  { key: 'empiricalCurrentsKa', label: 'Empirical: recorded peak currents', unit: 'kA', default: [], kind: 'number_list', source: 'Lightning-location records near the site (calibration, Methodology §7)' },
  { key: 'currentMinKa', label: 'Smallest current simulated (Imin)', unit: 'kA', default: 2, kind: 'number', source: `${ILLUSTRATIVE} (Methodology §1)` },
  { key: 'currentMaxKa', label: 'Largest current simulated (Imax)', unit: 'kA', default: 400, kind: 'number', source: `${ILLUSTRATIVE} (Methodology §1)` },
  { key: 'strikingDistanceA', label: 'Striking distance coefficient A (rs = A·I^b)', unit: 'm/kA^b', default: 10, kind: 'number', source: 'IEC 62305-1 rolling-sphere radii' },
  { key: 'strikingDistanceB', label: 'Striking distance exponent b', unit: '', default: 0.65, kind: 'number', source: 'IEC 62305-1 rolling-sphere radii' },
  { key: 'groundStrikingFactor', label: 'Ground striking factor kg (rg = kg·rs)', unit: '', default: 1, kind: 'number', source: 'Rolling-sphere assumption for structures; IEEE Std 1410 uses 0.9 for lines' },
  { key: 'returnStrokeVelocity', label: 'Return-stroke velocity', unit: 'm/s', default: 1.2e8, kind: 'number', source: 'IEEE Std 1410 (gives the 38.8 Ω simplified Rusk factor)' },
  { key: 'couplingOverride', label: 'Coupling Kc override (empty: Rusk)', unit: 'Ω (kV per kA·m/m)', default: null, kind: 'optional_number', source: 'Rusk (1958) from the return-stroke velocity unless calibrated (Methodology §3)' },
  ...thresholdMeta(),
  ...ignitionMeta(),
  { key: 'chemicalFlashPointLimitC', label: 'Chemicals: flash-point limit for flammable treatment', unit: '°C', default: 60, kind: 'number', source: 'GHS / UN flammable-liquid boundary (flash point ≤ 60 °C) — common practice' },
  { key: 'ignitionGivenSparkChemicalBelowLimit', label: 'Ignition given a spark, chemical at or below the limit (or unknown)', unit: 'probability', default: 0.4, kind: 'number', source: `${ILLUSTRATIVE}; treated like condensate` },
  { key: 'ignitionGivenSparkChemicalAboveLimit', label: 'Ignition given a spark, chemical above the limit', unit: 'probability', default: 0.02, kind: 'number', source: ILLUSTRATIVE },
  { key: 'ignitionGivenDirectNonConducting', label: 'Ignition given a direct strike, non-conducting tank with vapour space', unit: 'probability', default: 0.5, kind: 'number', source: `${ILLUSTRATIVE} (Methodology §4)` },
  { key: 'ignitionGivenDirectSteel', label: 'Ignition given a direct strike, steel tank with vapour space', unit: 'probability', default: 0.02, kind: 'number', source: `${ILLUSTRATIVE} (Methodology §4)` },
  { key: 'vapourControlFactor', label: 'Vapour-control factor on ignition', unit: '', default: 0.3, kind: 'number', source: ILLUSTRATIVE },
  ...damageRatioMeta(),
  { key: 'fireSpread.model', label: 'Fire spread to neighbouring tanks', unit: '', default: 'exponential', kind: 'choice', options: ['exponential', 'off'], source: 'p(d) = p0·exp(−d/L) up to dmax, d the shell-to-shell distance (Methodology §4); off: no spread' },
  { key: 'fireSpread.probabilityAtContact', label: 'Fire spread: probability to a touching neighbour (p0)', unit: 'probability', default: 0.25, kind: 'number', source: `${ILLUSTRATIVE}; ${SPREAD_BASIS}` },
  { key: 'fireSpread.decayLengthM', label: 'Fire spread: decay length (L)', unit: 'm', default: 5, kind: 'number', source: `${ILLUSTRATIVE}; ${SPREAD_BASIS}` },
  { key: 'fireSpread.maxDistanceM', label: 'Fire spread: largest shell-to-shell distance reached (dmax)', unit: 'm', default: 25, kind: 'number', source: `${ILLUSTRATIVE}; ${SPREAD_BASIS}` },
  { key: 'flashDensityFormula', label: 'Flash density from thunderstorm days', unit: '', default: 'anderson', kind: 'choice', options: ['anderson', 'iec'], source: 'Anderson 0.04·Td^1.25 (IEEE Std 1410, 1243); IEC 62305-2 0.1·Td' },
  { key: 'stormClustering.spreadKm', label: 'Storm clustering: spread of a storm\'s flashes around its centre (σ)', unit: 'km', default: 10, kind: 'number', source: `${ILLUSTRATIVE}; from memory: a thunderstorm system lays its ground flashes over a few tens of kilometres; lightning-location calibration replaces it` },
  { key: 'stormClustering.flashesPerStorm', label: 'Storm clustering: mean ground flashes per storm', unit: 'flashes', default: 1000, kind: 'number', source: `${ILLUSTRATIVE}; from memory: large storm systems produce of the order of a thousand ground flashes; lightning-location calibration replaces it` },
  { key: 'cutoffProbability', label: 'Negligible sparking probability (sets the simulated radius)', unit: 'probability', default: 1e-6, kind: 'number', source: 'Methodology §1' },
] satisfies AssumptionParameterMeta[])

// ---- validation -------------------------------------------------------------------------------

const num = (label: string) => z.number({ error: `${label} must be a number` }).refine(Number.isFinite, { error: `${label} must be a finite number` })
const positive = (label: string, unit: string) => num(label).refine((v) => v > 0, { error: `${label} must be above 0 ${unit}`.trim() })
const probability = (label: string) => num(label).refine((v) => v >= 0 && v <= 1, { error: `${label} is a probability: it must lie between 0 and 1` })

const thresholdSchema = (cls: ComponentClass) => z.strictObject({
  u50Kv: positive(`U50 of ${CLASS_LABELS[cls]}`, 'kV'),
  sigma: num(`σ of ${CLASS_LABELS[cls]}`).refine((v) => v >= 0 && v <= 3, { error: `σ of ${CLASS_LABELS[cls]} must lie between 0 (sharp threshold) and 3` }),
})

const damageRatioSchema = (label: string) => z.strictObject({
  mean: probability(`mean damage ratio (${label})`),
  sd: num(`damage ratio standard deviation (${label})`).refine((v) => v >= 0, { error: `the damage ratio standard deviation (${label}) must be 0 or more` }),
}).refine((d) => d.sd === 0 || d.sd * d.sd < d.mean * (1 - d.mean), {
  error: `the damage ratio standard deviation (${label}) must be below √(mean·(1 − mean)) for a distribution on [0, 1] (0 for a constant ratio)`,
})

export const assumptionSetSchema = z.strictObject({
  attachmentModel: z.enum(['egm', 'collection_area'], { error: "attachmentModel must be 'egm' or 'collection_area'" }),
  currentLaw: z.enum(['power_law', 'lognormal', 'empirical'], { error: "currentLaw must be 'power_law', 'lognormal' or 'empirical'" }),
  powerLawMedianKa: positive('power-law median current', 'kA'),
  powerLawExponent: positive('power-law exponent', ''),
  lognormalMedianKa: positive('log-normal median current', 'kA'),
  lognormalBeta: positive('log-normal β', ''),
  empiricalCurrentsKa: z.array(positive('each recorded current', 'kA'), { error: 'empiricalCurrentsKa must be a list of currents in kA' }),
  currentMinKa: positive('Imin', 'kA'),
  currentMaxKa: positive('Imax', 'kA'),
  strikingDistanceA: positive('striking distance coefficient A', ''),
  strikingDistanceB: num('striking distance exponent b').refine((v) => v > 0 && v <= 2, { error: 'striking distance exponent b must lie in (0, 2]' }),
  groundStrikingFactor: num('ground striking factor kg').refine((v) => v > 0 && v <= 2, { error: 'ground striking factor kg must lie in (0, 2]' }),
  returnStrokeVelocity: positive('return-stroke velocity', 'm/s').refine((v) => v < SPEED_OF_LIGHT_M_PER_S, { error: 'return-stroke velocity must be below the speed of light (299 792 458 m/s); typical values are 1–2·10⁸ m/s' }),
  couplingOverride: positive('coupling override Kc', 'Ω').nullable(),
  thresholds: z.strictObject({
    sharp_device: thresholdSchema('sharp_device'),
    grounded_pipe: thresholdSchema('grounded_pipe'),
    rounded_conductor: thresholdSchema('rounded_conductor'),
    carbon_fibre: thresholdSchema('carbon_fibre'),
  }),
  ignitionGivenSpark: z.strictObject({
    crude: probability('ignition given a spark (crude)'),
    condensate: probability('ignition given a spark (condensate)'),
    produced_water: probability('ignition given a spark (produced water)'),
    fresh_water: probability('ignition given a spark (fresh water)'),
  }),
  chemicalFlashPointLimitC: num('chemical flash-point limit'),
  ignitionGivenSparkChemicalBelowLimit: probability('ignition given a spark (chemical at or below the limit)'),
  ignitionGivenSparkChemicalAboveLimit: probability('ignition given a spark (chemical above the limit)'),
  ignitionGivenDirectNonConducting: probability('ignition given a direct strike (non-conducting tank)'),
  ignitionGivenDirectSteel: probability('ignition given a direct strike (steel tank)'),
  vapourControlFactor: probability('vapour-control factor'),
  damageRatio: z.strictObject({
    replacement: damageRatioSchema('replacement'),
    contents: damageRatioSchema('contents'),
    cleanup: damageRatioSchema('clean-up'),
    interruption: damageRatioSchema('interruption'),
  }),
  fireSpread: z.strictObject({
    model: z.enum(['exponential', 'off'], { error: "fireSpread.model must be 'exponential' or 'off'" }),
    probabilityAtContact: probability('fire spread probability at contact'),
    decayLengthM: positive('fire spread decay length', 'm'),
    maxDistanceM: num('largest fire spread distance').refine((v) => v >= 0, { error: 'the largest fire spread distance must be 0 m or more' }),
  }),
  flashDensityFormula: z.enum(['anderson', 'iec'], { error: "flashDensityFormula must be 'anderson' or 'iec'" }),
  cutoffProbability: num('cutoff probability').refine((v) => v > 0 && v <= 1e-3, { error: 'cutoff probability must lie in (0, 0.001]' }),
  stormClustering: z.strictObject({
    spreadKm: num('storm spread σ').refine((v) => v >= 0.5 && v <= 200, { error: 'storm spread σ must lie between 0.5 and 200 km' }),
    flashesPerStorm: num('mean ground flashes per storm').refine((v) => v >= 1 && v <= 1e6, { error: 'mean ground flashes per storm must lie between 1 and 1,000,000' }),
  }),
  uncertainty: assumptionUncertaintySchema,
}).superRefine((a, ctx) => {
  if (a.currentMinKa >= a.currentMaxKa) {
    ctx.addIssue({ code: 'custom', path: ['currentMinKa'], message: `Imin (${a.currentMinKa} kA) must be below Imax (${a.currentMaxKa} kA)` })
  }
  if (a.currentLaw === 'empirical') {
    const inside = a.empiricalCurrentsKa.filter((i) => i >= a.currentMinKa && i <= a.currentMaxKa)
    if (inside.length < 2) ctx.addIssue({ code: 'custom', path: ['empiricalCurrentsKa'], message: `the empirical current law needs at least two recorded currents between Imin and Imax (${a.currentMinKa}–${a.currentMaxKa} kA)` })
  }
  for (const issue of uncertaintyIssues(a as AssumptionSet, describeUncertainPath)) ctx.addIssue({ code: 'custom', ...issue })
})

/** Label and unit of a path that may carry an uncertainty (a numeric assumption or the flash density factor). */
export function describeUncertainPath(path: string): PathDescription | undefined {
  if (path === FLASH_DENSITY_FACTOR_PATH) return { label: FLASH_DENSITY_FACTOR_LABEL, unit: '×' }
  const meta = assumptionParameterMeta.find((m) => m.key === path)
  if (!meta || (meta.kind !== 'number' && meta.kind !== 'optional_number')) return undefined
  return { label: meta.label, unit: meta.unit }
}

/** Thrown for any invalid engine input; `issues` holds one readable line per problem, `fields` the message per dotted path. */
export class EngineInputError extends Error {
  readonly issues: string[]
  readonly fields: FieldMessages
  constructor(what: string, issues: string[], fields: FieldMessages = {}) {
    super(`${what}:\n  - ${issues.join('\n  - ')}`)
    this.name = 'EngineInputError'
    this.issues = issues
    this.fields = fields
  }

  static fromZod(what: string, error: z.ZodError): EngineInputError {
    return new EngineInputError(what, formatIssues(error), fieldMessages(error.issues))
  }
}

/** zod issues as "path: message" lines. */
export function formatIssues(error: z.ZodError): string[] {
  return error.issues.map((i) => (i.path.length > 0 ? `${i.path.join('.')}: ${i.message}` : i.message))
}

function isPlainObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v)
}

/** Deep merge of plain objects; arrays and scalars in `over` replace those in `base`. */
export function deepMerge(base: unknown, over: unknown): unknown {
  if (!isPlainObject(base) || !isPlainObject(over)) return over === undefined ? structuredClone(base) : over
  const out: Record<string, unknown> = {}
  for (const key of new Set([...Object.keys(base), ...Object.keys(over)])) out[key] = deepMerge(base[key], over[key])
  return out
}

/**
 * Keys of earlier engine versions that no longer mean anything: `damageFactorSigma` (the log-normal
 * damage factor with mean 1 and no upper bound, replaced by damage ratios on [0, 1] in engine 2).
 * Stored assumption versions that carry them stay readable; the value is dropped.
 */
export const RETIRED_ASSUMPTION_KEYS: readonly string[] = ['damageFactorSigma']

function withoutRetiredKeys(partial: unknown): unknown {
  if (!isPlainObject(partial)) return partial
  return Object.fromEntries(Object.entries(partial).filter(([key]) => !RETIRED_ASSUMPTION_KEYS.includes(key)))
}

/**
 * An illustrative uncertainty range belongs to its illustrative default value: where the set's value
 * differs from the default, the range (and any correlation naming it) is dropped. So a stored version
 * without `uncertainty` (made before assumptions carried uncertainty) reads with the illustrative
 * ranges of the values it still holds at their defaults, and none for values someone changed.
 */
function withoutStaleIllustrativeRanges(merged: unknown): unknown {
  if (!isPlainObject(merged) || !isPlainObject(merged.uncertainty) || !Array.isArray(merged.uncertainty.entries)) return merged
  const stale = new Set<string>()
  const entries = merged.uncertainty.entries.filter((e: unknown) => {
    if (!isPlainObject(e) || e.basis !== 'illustrative' || typeof e.path !== 'string' || e.path === FLASH_DENSITY_FACTOR_PATH) return true
    const value = assumptionValueAt(merged as unknown as AssumptionSet, e.path)
    const keep = value === assumptionValueAt(defaultAssumptions, e.path)
    if (!keep) stale.add(e.path)
    return keep
  })
  if (stale.size === 0) return merged
  const correlations = Array.isArray(merged.uncertainty.correlations)
    ? merged.uncertainty.correlations.filter((c: unknown) => !isPlainObject(c) || !(stale.has(c.a as string) || stale.has(c.b as string)))
    : merged.uncertainty.correlations
  return { ...merged, uncertainty: { ...merged.uncertainty, entries, correlations } }
}

/** Merge a partial assumption set over the defaults and validate it; throws EngineInputError. */
export function parseAssumptions(partial: unknown = {}): AssumptionSet {
  if (partial !== undefined && partial !== null && !isPlainObject(partial)) {
    throw new EngineInputError('Invalid assumption set', ['the assumption set must be an object'])
  }
  const merged = withoutStaleIllustrativeRanges(deepMerge(defaultAssumptions, withoutRetiredKeys(partial ?? {})))
  const result = assumptionSetSchema.safeParse(merged)
  if (!result.success) throw EngineInputError.fromZod('Invalid assumption set', result.error)
  return result.data
}

/** Readable words for the choices of the assumption set (screens and exports; the stored value is the key). */
export const ASSUMPTION_CHOICE_LABELS: Record<string, string> = {
  egm: 'electrogeometric model (rolling sphere)',
  collection_area: 'collection area (IEC 62305-2, 3H)',
  power_law: 'power law (IEEE Std 1410)',
  lognormal: 'log-normal (CIGRE)',
  empirical: 'empirical, from records',
  exponential: 'exponential with distance',
  off: 'off (no spread)',
  anderson: 'Anderson, 0.04·Td^1.25 (IEEE Std 1410)',
  iec: 'IEC 62305-2, 0.1·Td',
}

/** The readable label of a choice value, or the value with spaces for underscores. */
export function choiceLabel(value: string): string {
  return ASSUMPTION_CHOICE_LABELS[value] ?? value.replace(/_/g, ' ')
}
