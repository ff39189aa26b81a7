// Words and form fields for assumption uncertainties (the assumptions pages): what a distribution
// says in words with its units, which fields each kind of distribution has, a starting distribution
// for a value that gets one, and the differences between two versions' uncertainties.
import { describeUncertainPath, type AssumptionSet } from '../engine/assumptions'
import { distributionQuantile, FLASH_DENSITY_FACTOR_PATH, uncertainPathRange, type ValueRange } from '../engine/uncertainty-ranges'
import type { AssumptionCorrelation, AssumptionUncertainty, UncertainAssumption, UncertainDistribution, UncertaintyBasis } from '../engine/uncertainty-types'
import { getPath } from '../paths'
import { formatNumber } from '../format'

export type DistributionKind = UncertainDistribution['kind']

/** JSON with object keys sorted: the database (jsonb) does not keep the order keys were written in. */
export function stableJson(value: unknown): string {
  return JSON.stringify(value, (_key, v: unknown) => (v && typeof v === 'object' && !Array.isArray(v)
    ? Object.fromEntries(Object.entries(v as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)))
    : v))
}

export const DISTRIBUTION_KINDS: readonly { kind: DistributionKind, label: string }[] = [
  { kind: 'lognormal', label: 'log-normal' },
  { kind: 'normal', label: 'normal (truncated to the valid range)' },
  { kind: 'uniform', label: 'uniform' },
  { kind: 'triangular', label: 'triangular' },
]

export const BASIS_LABELS: Record<UncertaintyBasis, string> = {
  illustrative: 'illustrative range — calibrate',
  calibration: 'from a calibration',
  analyst: 'analyst\'s judgement',
}

/** A field of a distribution's form: its key, label and whether it carries the assumption's unit. */
export interface DistributionField { key: string, label: string, withUnit: boolean, optional?: boolean }

export const DISTRIBUTION_FIELDS: Record<DistributionKind, readonly DistributionField[]> = {
  lognormal: [{ key: 'median', label: 'Median', withUnit: true }, { key: 'sigmaLn', label: 'σ of ln(value)', withUnit: false }],
  normal: [
    { key: 'mean', label: 'Mean', withUnit: true }, { key: 'sd', label: 'Standard deviation', withUnit: true },
    { key: 'min', label: 'Lower bound (empty: valid range)', withUnit: true, optional: true }, { key: 'max', label: 'Upper bound (empty: valid range)', withUnit: true, optional: true },
  ],
  uniform: [{ key: 'min', label: 'Lower bound', withUnit: true }, { key: 'max', label: 'Upper bound', withUnit: true }],
  triangular: [{ key: 'min', label: 'Lower bound', withUnit: true }, { key: 'mode', label: 'Mode', withUnit: true }, { key: 'max', label: 'Upper bound', withUnit: true }],
}

/** The unit as shown after a number ('' for dimensionless values and probabilities). */
export function unitAfter(unit: string): string {
  return unit && unit !== 'dimensionless' && unit !== 'probability' && !unit.startsWith('share') ? ` ${unit}` : ''
}

export function number(v: number): string {
  if (!Number.isFinite(v)) return String(v)
  if (v !== 0 && (Math.abs(v) >= 1e5 || Math.abs(v) < 1e-3)) return formatNumber(v, 3)
  return String(Number(v.toPrecision(3)))
}

export function labelOf(path: string): string {
  return describeUncertainPath(path)?.label ?? path
}

export function unitOf(path: string): string {
  return describeUncertainPath(path)?.unit ?? ''
}

/** The distribution in words with units, e.g. "log-normal, median 70 kV, σ of ln 0.35". */
export function describeDistribution(d: UncertainDistribution, unit: string): string {
  const u = unitAfter(unit)
  switch (d.kind) {
    case 'lognormal': return `log-normal, median ${number(d.median)}${u}, σ of ln(value) ${number(d.sigmaLn)}`
    case 'normal': {
      const bounds = d.min !== undefined || d.max !== undefined ? `, truncated to ${d.min !== undefined ? number(d.min) : 'the valid lower end'}–${d.max !== undefined ? number(d.max) : 'the valid upper end'}${u}` : ', truncated to the valid range'
      return `normal, mean ${number(d.mean)}${u}, standard deviation ${number(d.sd)}${u}${bounds}`
    }
    case 'uniform': return `uniform, ${number(d.min)} to ${number(d.max)}${u}`
    case 'triangular': return `triangular, ${number(d.min)} to ${number(d.max)}${u}, mode ${number(d.mode)}${u}`
  }
}

/** The valid range of a path in the given parameters (null when the parameters do not read as a set). */
export function validRange(parameters: AssumptionSet | null, path: string): ValueRange | undefined {
  return parameters ? uncertainPathRange(parameters, path) ?? undefined : undefined
}

/** "5–95 %: 40.9 to 120 kV", the central 90 % of the distribution. */
export function ninetyPercentRange(d: UncertainDistribution, unit: string, valid?: ValueRange): string {
  return `${number(distributionQuantile(d, 0.05, valid))} to ${number(distributionQuantile(d, 0.95, valid))}${unitAfter(unit)}`
}

/** Paths that may carry an uncertainty, in form order: the numeric assumptions, then the flash density factor. */
export function uncertainPaths(numericKeys: readonly string[]): string[] {
  return [...numericKeys, FLASH_DENSITY_FACTOR_PATH]
}

/**
 * A starting distribution around a value: log-normal (σ of ln 0.2, about ×/÷ 1.5 at 95 %) for values
 * that are positive without an upper end, otherwise a normal with a standard deviation of 10 % of the
 * value (or of the valid range's width), truncated to the valid range. The analyst then sets it.
 */
export function startingDistribution(value: number, valid: ValueRange | undefined): UncertainDistribution {
  if (valid && valid.min >= 0 && valid.max === Infinity && value > 0) return { kind: 'lognormal', median: value, sigmaLn: 0.2 }
  const width = valid && Number.isFinite(valid.max - valid.min) ? valid.max - valid.min : Math.abs(value) || 1
  const sd = Math.abs(value) > 0 ? Math.min(Math.abs(value) * 0.1, width * 0.25) : width * 0.05
  return { kind: 'normal', mean: value, sd: Number(sd.toPrecision(2)) || 0.01 }
}

/** The distribution after a change of kind, keeping its centre and spread roughly. */
export function changeKind(d: UncertainDistribution, kind: DistributionKind, valid: ValueRange | undefined): UncertainDistribution {
  if (d.kind === kind) return d
  const lo = distributionQuantile(d, 0.05, valid)
  const hi = distributionQuantile(d, 0.95, valid)
  const mid = distributionQuantile(d, 0.5, valid)
  const round = (x: number) => Number(x.toPrecision(3))
  switch (kind) {
    case 'lognormal': return { kind, median: round(mid > 0 ? mid : 1), sigmaLn: round(lo > 0 && hi > lo ? Math.log(hi / lo) / (2 * 1.645) : 0.2) }
    case 'normal': return { kind, mean: round(mid), sd: round((hi - lo) / (2 * 1.645)) || 0.01 }
    case 'uniform': return { kind, min: round(lo), max: round(hi) }
    case 'triangular': return { kind, min: round(lo), mode: round(mid), max: round(hi) }
  }
}

/** The value of an assumption in parameters (1 for the flash density factor: the sites' own values). */
export function centralValue(parameters: unknown, path: string): number | null {
  if (path === FLASH_DENSITY_FACTOR_PATH) return 1
  const v = getPath(parameters, path)
  return typeof v === 'number' ? v : null
}

export interface UncertaintyDifference { path: string, label: string, a: UncertainAssumption | undefined, b: UncertainAssumption | undefined, differs: boolean }

/** Per path, the two versions' uncertainties side by side, in the order the paths are listed. */
export function compareUncertainty(a: AssumptionUncertainty | undefined, b: AssumptionUncertainty | undefined, order: readonly string[]): UncertaintyDifference[] {
  const byPath = (u: AssumptionUncertainty | undefined) => new Map((u?.entries ?? []).map(e => [e.path, e]))
  const ma = byPath(a)
  const mb = byPath(b)
  const paths = [...new Set([...ma.keys(), ...mb.keys()])].sort((x, y) => rank(order, x) - rank(order, y))
  return paths.map(path => {
    const ea = ma.get(path)
    const eb = mb.get(path)
    return { path, label: labelOf(path), a: ea, b: eb, differs: stableJson(ea ?? null) !== stableJson(eb ?? null) }
  })
}

function rank(order: readonly string[], path: string): number {
  const i = order.indexOf(path)
  return i < 0 ? order.length : i
}

export function correlationText(c: AssumptionCorrelation): string {
  return `${labelOf(c.a)} ↔ ${labelOf(c.b)}: ρ = ${number(c.rho)}`
}

// ---- form state ----------------------------------------------------------------------------------

/** One uncertainty as the form holds it: texts for the numbers, the basis it had, its saved distribution. */
export interface EntryDraft {
  path: string
  kind: DistributionKind
  values: Record<string, string>
  basis: UncertaintyBasis
  note: string
  /** The distribution as saved (key-order free JSON), to tell an edited distribution from an untouched one. */
  saved: string
}

export interface CorrelationDraft { a: string, b: string, rho: string }

const text = (v: number | undefined) => (v === undefined ? '' : String(v))

export function distributionTexts(d: UncertainDistribution): Record<string, string> {
  return Object.fromEntries(DISTRIBUTION_FIELDS[d.kind].map(f => [f.key, text((d as unknown as Record<string, number | undefined>)[f.key])]))
}

export function draftOf(e: UncertainAssumption): EntryDraft {
  return { path: e.path, kind: e.distribution.kind, values: distributionTexts(e.distribution), basis: e.basis, note: e.note, saved: stableJson(e.distribution) }
}

/** The distribution the texts say (NaN where a required number is missing, which validation then names). */
export function distributionOf(d: Pick<EntryDraft, 'kind' | 'values'>): UncertainDistribution {
  const n = (key: string) => { const t = (d.values[key] ?? '').trim(); return t === '' ? Number.NaN : Number(t) }
  const optional = (key: string) => { const t = (d.values[key] ?? '').trim(); return t === '' ? undefined : Number(t) }
  switch (d.kind) {
    case 'lognormal': return { kind: 'lognormal', median: n('median'), sigmaLn: n('sigmaLn') }
    case 'normal': {
      const min = optional('min')
      const max = optional('max')
      return { kind: 'normal', mean: n('mean'), sd: n('sd'), ...(min === undefined ? {} : { min }), ...(max === undefined ? {} : { max }) }
    }
    case 'uniform': return { kind: 'uniform', min: n('min'), max: n('max') }
    case 'triangular': return { kind: 'triangular', min: n('min'), mode: n('mode'), max: n('max') }
  }
}

/** The entry a draft stands for: a changed distribution is the analyst's; an untouched one keeps its basis. */
export function entryOf(d: EntryDraft): UncertainAssumption {
  const distribution = distributionOf(d)
  const basis = stableJson(distribution) === d.saved ? d.basis : 'analyst'
  return { path: d.path, distribution, basis, note: d.note.trim() }
}

export function uncertaintyOf(entries: readonly EntryDraft[], correlations: readonly CorrelationDraft[]): AssumptionUncertainty {
  return {
    entries: entries.map(entryOf),
    correlations: correlations.map(c => ({ a: c.a, b: c.b, rho: c.rho.trim() === '' ? Number.NaN : Number(c.rho) })),
  }
}
