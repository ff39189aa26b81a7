// Uncertain assumptions checked against the assumption set they belong to (issue "How sure are we"):
// which paths may carry an uncertainty, the valid range of each (the same bounds the set's own
// validation applies), quantiles of the distributions, and the readable problems of an uncertainty.
// The shapes are in uncertainty-types.ts; drawing and propagation are the engine's draw code.
import type { AssumptionSet } from './assumptions'
import { SPEED_OF_LIGHT_M_PER_S } from './induction'
import { normalCdf, normalQuantile } from './normal'
import type { UncertainAssumption, UncertainDistribution } from './uncertainty-types'

/**
 * Reserved path: a multiplier on every site's ground flash density Ng (median 1). Flash density is a
 * site input, not an assumption-set number, so its uncertainty is a factor on whatever each site holds.
 */
export const FLASH_DENSITY_FACTOR_PATH = 'flashDensityFactor'

/** The peak-current law's parameters (one natural group of the draws; calibrated from lightning records). */
export const CURRENT_LAW_PATHS: readonly string[] = ['powerLawMedianKa', 'powerLawExponent', 'lognormalMedianKa', 'lognormalBeta']
export const FLASH_DENSITY_FACTOR_LABEL = 'Flash density factor (× every site\'s ground flash density Ng)'

/** A valid range [min, max] of one value; an open end excludes its bound (e.g. U50 > 0 kV). */
export interface ValueRange { min: number; max: number; minOpen: boolean; maxOpen: boolean }

const range = (min: number, max: number, minOpen = false, maxOpen = false): ValueRange => ({ min, max, minOpen, maxOpen })
const POSITIVE = range(0, Infinity, true, true)
const PROBABILITY = range(0, 1)

/** The numeric value at a dotted path of the set, or undefined when the path names no number. */
export function assumptionValueAt(set: AssumptionSet, path: string): number | null | undefined {
  let node: unknown = set
  for (const part of path.split('.')) {
    if (typeof node !== 'object' || node === null || Array.isArray(node)) return undefined
    node = (node as Record<string, unknown>)[part]
  }
  if (node === null) return null
  return typeof node === 'number' ? node : undefined
}

/**
 * The valid range of the numeric assumption at `path` (the bounds assumptionSetSchema enforces),
 * or null when the path names no numeric assumption that may carry an uncertainty. Ranges that
 * depend on another value (a damage ratio's mean and standard deviation bound each other) use that
 * other value as it stands in the set.
 */
export function uncertainPathRange(set: AssumptionSet, path: string): ValueRange | null {
  if (path === FLASH_DENSITY_FACTOR_PATH) return POSITIVE
  const parts = path.split('.')
  switch (parts[0]) {
    case 'powerLawMedianKa': case 'powerLawExponent': case 'lognormalMedianKa': case 'lognormalBeta':
    case 'currentMinKa': case 'currentMaxKa': case 'strikingDistanceA': case 'couplingOverride':
      return parts.length === 1 ? POSITIVE : null
    case 'strikingDistanceB': case 'groundStrikingFactor':
      return parts.length === 1 ? range(0, 2, true) : null
    case 'returnStrokeVelocity':
      return parts.length === 1 ? range(0, SPEED_OF_LIGHT_M_PER_S, true, true) : null
    case 'chemicalFlashPointLimitC':
      return parts.length === 1 ? range(-Infinity, Infinity, true, true) : null
    case 'ignitionGivenSparkChemicalBelowLimit': case 'ignitionGivenSparkChemicalAboveLimit':
    case 'ignitionGivenDirectNonConducting': case 'ignitionGivenDirectSteel': case 'vapourControlFactor':
      return parts.length === 1 ? PROBABILITY : null
    case 'cutoffProbability':
      return parts.length === 1 ? range(0, 1e-3, true) : null
    case 'thresholds':
      if (parts.length !== 3 || !(parts[1]! in set.thresholds)) return null
      return parts[2] === 'u50Kv' ? POSITIVE : parts[2] === 'sigma' ? range(0, 3) : null
    case 'ignitionGivenSpark':
      return parts.length === 2 && parts[1]! in set.ignitionGivenSpark ? PROBABILITY : null
    case 'damageRatio': {
      const ratio = parts.length === 3 ? set.damageRatio[parts[1] as keyof AssumptionSet['damageRatio']] : undefined
      if (!ratio) return null
      // A beta distribution on [0, 1] needs sd² < mean·(1 − mean).
      if (parts[2] === 'mean') {
        if (ratio.sd === 0) return PROBABILITY
        const half = Math.sqrt(Math.max(0, 1 - 4 * ratio.sd * ratio.sd)) / 2
        return range(0.5 - half, 0.5 + half, true, true)
      }
      if (parts[2] === 'sd') return range(0, Math.sqrt(ratio.mean * (1 - ratio.mean)), false, true)
      return null
    }
    case 'fireSpread':
      if (parts.length !== 2) return null
      if (parts[1] === 'probabilityAtContact') return PROBABILITY
      if (parts[1] === 'decayLengthM') return POSITIVE
      if (parts[1] === 'maxDistanceM') return range(0, Infinity, false, true)
      return null
    case 'stormClustering':
      if (parts.length !== 2) return null
      if (parts[1] === 'spreadKm') return range(0.5, 200)
      if (parts[1] === 'flashesPerStorm') return range(1, 1e6)
      return null
    default:
      return null
  }
}

/** The interval a distribution lives on: its own bounds, a normal's truncation (the valid range by default). */
export function distributionSupport(d: UncertainDistribution, valid: ValueRange): { min: number; max: number } {
  switch (d.kind) {
    case 'lognormal': return { min: 0, max: Infinity }
    case 'normal': return { min: d.min ?? valid.min, max: d.max ?? valid.max }
    case 'uniform': case 'triangular': return { min: d.min, max: d.max }
  }
}

/**
 * The p-quantile (0 < p < 1) of a distribution; a normal is truncated to its bounds, which default
 * to the assumption's valid range (inverse-CDF of the truncated normal: Φ⁻¹(Φ(a) + p·(Φ(b) − Φ(a)))).
 */
export function distributionQuantile(d: UncertainDistribution, p: number, valid: ValueRange = range(-Infinity, Infinity, true, true)): number {
  switch (d.kind) {
    case 'lognormal': return d.median * Math.exp(d.sigmaLn * normalQuantile(p))
    case 'normal': {
      const { min, max } = distributionSupport(d, valid)
      const lo = normalCdf((min - d.mean) / d.sd)
      const hi = normalCdf((max - d.mean) / d.sd)
      const x = d.mean + d.sd * normalQuantile(lo + p * (hi - lo))
      return Math.min(max, Math.max(min, x))
    }
    case 'uniform': return d.min + p * (d.max - d.min)
    case 'triangular': {
      const { min, mode, max } = d
      const f = (mode - min) / (max - min)
      return p < f ? min + Math.sqrt(p * (max - min) * (mode - min)) : max - Math.sqrt((1 - p) * (max - min) * (max - mode))
    }
  }
}

/** The share of a normal's mass kept by its truncation, Φ(b) − Φ(a). */
export function truncatedNormalMass(d: Extract<UncertainDistribution, { kind: 'normal' }>, valid: ValueRange): number {
  const { min, max } = distributionSupport(d, valid)
  return normalCdf((max - d.mean) / d.sd) - normalCdf((min - d.mean) / d.sd)
}

/** The central value a distribution is built around (median, mean or mode), for display. */
export function distributionCentre(d: UncertainDistribution): number {
  switch (d.kind) {
    case 'lognormal': return d.median
    case 'normal': return d.mean
    case 'uniform': return (d.min + d.max) / 2
    case 'triangular': return d.mode
  }
}

/** The quantiles inside which an assumption's own value must lie: a central value far out in its tails is a mistake. */
export const VALUE_COVERAGE = { lo: 0.001, hi: 0.999 } as const

export interface UncertaintyIssue { path: (string | number)[]; message: string }

const shown = (v: number) => (Math.abs(v) >= 1e5 || (Math.abs(v) > 0 && Math.abs(v) < 1e-3) ? v.toExponential(3) : String(Number(v.toPrecision(4))))

const unitSuffix = (unit: string) => (unit && unit !== 'dimensionless' && unit !== 'probability' && !unit.startsWith('share') ? ` ${unit}` : '')

function rangeText(r: ValueRange, unit: string): string {
  const u = unitSuffix(unit)
  if (r.min === -Infinity && r.max === Infinity) return 'any value'
  if (r.max === Infinity) return `${r.minOpen ? 'above' : 'at least'} ${shown(r.min)}${u}`
  if (r.min === -Infinity) return `${r.maxOpen ? 'below' : 'at most'} ${shown(r.max)}${u}`
  return `${r.minOpen ? '(' : '['}${shown(r.min)}, ${shown(r.max)}${r.maxOpen ? ')' : ']'}${u}`
}

export interface PathDescription { label: string; unit: string }

/**
 * Problems of a set's uncertainty against the set itself, each at its dotted path under
 * `uncertainty`: the path must name a numeric assumption (or the flash density factor), the
 * distribution must stay inside the assumption's valid range, and the assumption's own value must
 * lie inside the distribution's 0.1–99.9 % range (the central run is a plausible draw).
 */
export function uncertaintyIssues(set: AssumptionSet, describe: (path: string) => PathDescription | undefined): UncertaintyIssue[] {
  const issues: UncertaintyIssue[] = []
  set.uncertainty.entries.forEach((entry: UncertainAssumption, i) => {
    const at = (...rest: (string | number)[]) => ['uncertainty', 'entries', i, ...rest]
    const described = describe(entry.path)
    const valid = uncertainPathRange(set, entry.path)
    const value = entry.path === FLASH_DENSITY_FACTOR_PATH ? 1 : assumptionValueAt(set, entry.path)
    if (!valid || !described || value === undefined) {
      issues.push({ path: at('path'), message: `${entry.path} is not a numeric assumption that can carry an uncertainty` })
      return
    }
    const name = described.label
    if (value === null) {
      issues.push({ path: at('path'), message: `${name} is empty, so it has no value to be uncertain about; set the value first` })
      return
    }
    const d = entry.distribution
    const where = rangeText(valid, described.unit)
    const u = unitSuffix(described.unit)
    // A bound equal to an open end is accepted: a continuous draw lands on it with probability 0.
    const below = (x: number) => x < valid.min
    const above = (x: number) => x > valid.max
    const before = issues.length
    switch (d.kind) {
      case 'lognormal':
        if (valid.min < 0) issues.push({ path: at('distribution', 'kind'), message: `${name} may be negative or zero (valid: ${where}); a log-normal only gives positive values — use a normal, uniform or triangular distribution` })
        else if (valid.max !== Infinity) issues.push({ path: at('distribution', 'kind'), message: `${name} must stay within ${where}; a log-normal has no upper bound — use a normal (truncated to the range), uniform or triangular distribution` })
        break
      case 'normal':
        if (d.min !== undefined && below(d.min)) issues.push({ path: at('distribution', 'min'), message: `the lower bound of ${name} (${shown(d.min)}${u}) lies outside its valid range ${where}` })
        if (d.max !== undefined && above(d.max)) issues.push({ path: at('distribution', 'max'), message: `the upper bound of ${name} (${shown(d.max)}${u}) lies outside its valid range ${where}` })
        if (d.min === undefined && d.max === undefined && !(valid.min > -Infinity || valid.max < Infinity)) break
        if (truncatedNormalMass(d, valid) < 1e-3) issues.push({ path: at('distribution', 'mean'), message: `the normal distribution of ${name} keeps almost nothing inside its bounds (mean ${shown(d.mean)} far outside ${rangeText({ ...valid, ...distributionSupport(d, valid) }, described.unit)})` })
        break
      case 'uniform': case 'triangular':
        if (below(d.min)) issues.push({ path: at('distribution', 'min'), message: `the lower bound of ${name} (${shown(d.min)}${u}) lies outside its valid range ${where}` })
        if (above(d.max)) issues.push({ path: at('distribution', 'max'), message: `the upper bound of ${name} (${shown(d.max)}${u}) lies outside its valid range ${where}` })
        break
    }
    if (issues.length > before) return
    const lo = distributionQuantile(d, VALUE_COVERAGE.lo, valid)
    const hi = distributionQuantile(d, VALUE_COVERAGE.hi, valid)
    if (value < lo || value > hi) {
      const what = entry.path === FLASH_DENSITY_FACTOR_PATH ? 'a factor of 1 (the sites\' own flash densities)' : `its value ${shown(value)}${u}`
      issues.push({ path: at('distribution'), message: `the uncertainty of ${name} does not cover ${what}: its 0.1–99.9 % range is ${shown(lo)} to ${shown(hi)}${u}; centre it on the value or widen it` })
    }
  })
  return issues
}
