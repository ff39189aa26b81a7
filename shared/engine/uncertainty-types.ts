// Uncertainty in the assumptions (issue "How sure are we"): the shapes every part of the product
// agrees on. An assumption version may say, for any numeric assumption, how far its value is known:
// a distribution with its parameters (in the assumption's own unit) and where that came from; two
// values estimated together carry their correlation. Sampling and propagation live elsewhere
// (the engine's draw code); this file holds only the shapes and their validation.
import { z } from 'zod'

/** Where an uncertainty came from: an illustrative range (labelled as such), a calibration, or the analyst. */
export type UncertaintyBasis = 'illustrative' | 'calibration' | 'analyst'

/**
 * A distribution of one assumption's value, in the assumption's unit.
 * - lognormal: median and σ of ln(value) (sigmaLn > 0); for positive values.
 * - normal: mean and standard deviation, truncated to [min, max] (the assumption's valid range when omitted).
 * - uniform: on [min, max].
 * - triangular: on [min, max] with its mode.
 */
export type UncertainDistribution =
  | { kind: 'lognormal'; median: number; sigmaLn: number }
  | { kind: 'normal'; mean: number; sd: number; min?: number; max?: number }
  | { kind: 'uniform'; min: number; max: number }
  | { kind: 'triangular'; min: number; mode: number; max: number }

export interface UncertainAssumption {
  /** Dotted path of a numeric assumption, as in assumptionParameterMeta (e.g. `thresholds.sharp_device.u50Kv`). */
  path: string
  distribution: UncertainDistribution
  basis: UncertaintyBasis
  /** Readable provenance: the calibration and its version, or the reason for an illustrative range. */
  note: string
}

/** Correlation of two uncertain assumptions (a Gaussian copula's ρ, −1 < ρ < 1). */
export interface AssumptionCorrelation { a: string; b: string; rho: number }

export interface AssumptionUncertainty {
  entries: UncertainAssumption[]
  correlations: AssumptionCorrelation[]
}

export const emptyUncertainty = (): AssumptionUncertainty => ({ entries: [], correlations: [] })

const finite = (label: string) => z.number({ error: `${label} must be a number` }).refine(Number.isFinite, { error: `${label} must be a finite number` })

export const uncertainDistributionSchema = z.discriminatedUnion('kind', [
  z.strictObject({
    kind: z.literal('lognormal'),
    median: finite('the median').refine((v) => v > 0, { error: 'a log-normal median must be above 0' }),
    sigmaLn: finite('σ of ln(value)').refine((v) => v > 0 && v <= 3, { error: 'σ of ln(value) must lie in (0, 3]' }),
  }),
  z.strictObject({
    kind: z.literal('normal'),
    mean: finite('the mean'),
    sd: finite('the standard deviation').refine((v) => v > 0, { error: 'the standard deviation must be above 0' }),
    min: finite('the lower bound').optional(),
    max: finite('the upper bound').optional(),
  }).refine((d) => d.min === undefined || d.max === undefined || d.min < d.max, { error: 'the lower bound must be below the upper bound', path: ['min'] }),
  z.strictObject({
    kind: z.literal('uniform'),
    min: finite('the lower bound'),
    max: finite('the upper bound'),
  }).refine((d) => d.min < d.max, { error: 'the lower bound must be below the upper bound', path: ['min'] }),
  z.strictObject({
    kind: z.literal('triangular'),
    min: finite('the lower bound'),
    mode: finite('the mode'),
    max: finite('the upper bound'),
  }).refine((d) => d.min < d.max && d.mode >= d.min && d.mode <= d.max, { error: 'a triangular distribution needs lower bound ≤ mode ≤ upper bound, with lower below upper', path: ['mode'] }),
], { error: "the distribution must be 'lognormal', 'normal', 'uniform' or 'triangular'" })

export const uncertainAssumptionSchema = z.strictObject({
  path: z.string().min(1, { error: 'name the assumption (its dotted path)' }).max(200),
  distribution: uncertainDistributionSchema,
  basis: z.enum(['illustrative', 'calibration', 'analyst'], { error: "basis must be 'illustrative', 'calibration' or 'analyst'" }),
  note: z.string().max(500).default(''),
})

export const assumptionCorrelationSchema = z.strictObject({
  a: z.string().min(1).max(200),
  b: z.string().min(1).max(200),
  rho: finite('the correlation').refine((v) => v > -1 && v < 1, { error: 'a correlation must lie strictly between −1 and 1' }),
}).refine((c) => c.a !== c.b, { error: 'a correlation needs two different assumptions', path: ['b'] })

export const assumptionUncertaintySchema = z.strictObject({
  entries: z.array(uncertainAssumptionSchema).max(100),
  correlations: z.array(assumptionCorrelationSchema).max(200).default([]),
}).superRefine((u, ctx) => {
  const paths = new Set<string>()
  u.entries.forEach((e, i) => {
    if (paths.has(e.path)) ctx.addIssue({ code: 'custom', path: ['entries', i, 'path'], message: `${e.path} has two uncertainties; keep one` })
    paths.add(e.path)
  })
  u.correlations.forEach((c, i) => {
    for (const key of ['a', 'b'] as const) {
      if (!paths.has(c[key])) ctx.addIssue({ code: 'custom', path: ['correlations', i, key], message: `${c[key]} is correlated but has no uncertainty` })
    }
  })
})
