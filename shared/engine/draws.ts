// Assumption draws (issue "How sure are we"): complete assumption sets drawn from the uncertainty
// an assumption version carries, for the bands and the sensitivity indices of a run.
//
// - Each uncertain assumption has a marginal distribution (uncertainty-types.ts), truncated to the
//   assumption's valid range (and a normal's own bounds) and sampled by inversion on the truncated
//   range: u' = F(lo) + u·(F(hi) − F(lo)), x = F⁻¹(u').
// - Correlations by a Gaussian copula: independent standard normals z, correlated as L·z with L
//   the Cholesky factor of the correlation matrix (refused when not positive definite), u = Φ(L·z).
// - The K band draws are two independent Latin hypercubes (McKay, Beckman & Conover 1979) of
//   ⌈K/2⌉ and ⌊K/2⌋ rows: in each, the z of each input has one draw in each equal-probability
//   stratum, in a random order.
// - Saltelli's design (sensitivity.ts) with N = ⌊K/2⌋ base rows: A is the first N rows of the first
//   hypercube, B the second hypercube (independent of A, as the estimators need), and per factor g
//   the matrix A_B^g (A with factor g's z from B). So f(A) and f(B) are band draws already computed,
//   and the design adds factors × N evaluations to the K + 1 of the bands (instead of
//   (factors + 1) × K with a separate B of K rows): the indices' bootstrap error shows the price of
//   the smaller N. Correlated assumptions form one factor (a group), so swapping a factor keeps the
//   copula's correlation inside it.
// - A drawn damage-ratio standard deviation that is too large for its drawn mean (a beta on [0, 1]
//   needs sd² < mean·(1 − mean)) is clamped to 0.99·√(mean·(1 − mean)); the count of clamped values
//   is reported. Every drawn set is then validated by the assumption schema.
// Deterministic in (run seed, assumptions, K): the streams are seeded by the run seed.
import type { AssumptionSet } from './assumptions'
import { assumptionParameterMeta, assumptionSetSchema, EngineInputError } from './assumptions'
import { SPEED_OF_LIGHT_M_PER_S } from './induction'
import { CURRENT_LAW_PATHS } from './uncertainty-ranges'
import { normalCdf, normalQuantile } from './normal'
import { createStream } from './random'
import { emptyUncertainty, type UncertainAssumption, type UncertainDistribution } from './uncertainty-types'

/** Reserved path: a multiplier on every site's flash density Ng (median 1), for the Ng calibrations' uncertainty. */
export const FLASH_DENSITY_FACTOR_PATH = 'flashDensityFactor'

/** Least and largest number of draws a run may ask for. */
export const MIN_DRAWS = 50
export const MAX_DRAWS = 500

/**
 * Assumptions the draws cannot carry: they move the attachment geometry or the simulated range,
 * which the shared flash samples fix (draw-figures.ts re-evaluates only what can be re-weighted).
 */
export const PATHS_REFUSED_FOR_DRAWS: Readonly<Record<string, string>> = {
  strikingDistanceA: 'the striking distance sets where each shared flash attaches',
  strikingDistanceB: 'the striking distance sets where each shared flash attaches',
  groundStrikingFactor: 'the ground striking factor sets where each shared flash attaches',
  currentMinKa: 'Imin bounds the range of the shared current samples',
  currentMaxKa: 'Imax bounds the range of the shared current samples',
  cutoffProbability: 'the cutoff sets the simulated radius, not a physical quantity',
  chemicalFlashPointLimitC: 'the flash-point limit is a classification boundary, not an estimated value',
  'stormClustering.spreadKm': 'storm clustering is not part of the frequency figures the draws re-evaluate',
  'stormClustering.flashesPerStorm': 'storm clustering is not part of the frequency figures the draws re-evaluate',
}

/** One draw: a complete assumption set and the flash-density multiplier. */
export interface AssumptionDraw { assumptions: AssumptionSet; flashDensityFactor: number }

/**
 * A factor of the sensitivity analysis: one assumption, correlated assumptions taken together, or
 * (when there are more than MAX_SINGLE_FACTORS factors) a natural group of assumptions whose indices
 * are Sobol' group indices; `members` lists what a group of more than one assumption holds.
 */
export interface DrawFactor { paths: string[]; path: string; label: string; unit: string; members?: { path: string; label: string; unit: string }[] }

/**
 * Most factors a plan analyses one by one. Each factor costs N = ⌊K/2⌋ evaluations (1 + K + N·factors
 * in all); above this the assumptions are taken in natural groups (naturalGroupOf): 7 factors for
 * the 26 default ranges (bench/draws.ts and docs/engine.md give the cost over the benchmark portfolio).
 */
export const MAX_SINGLE_FACTORS = 10

/**
 * The natural group of an assumption, named so that a group matches a calibration page where there
 * is one: the sparking levels and scatter of the component classes (impulse-test calibration), the
 * current law and the flash density (lightning calibration), the coupling, ignition, damage, fire
 * spread; anything else stands alone. `coarse` (used only when the fine groups are still more than
 * MAX_SINGLE_FACTORS) takes every other assumption into one "other" group, at most 8 groups
 * whatever the number of assumptions.
 */
export function naturalGroupOf(path: string, coarse = false): { key: string; label: string } {
  const t = /^thresholds\.([a-z_]+)\.(u50Kv|sigma)$/.exec(path)
  // Every class together: each sparking factor costs a full set of sparking probabilities per
  // evaluation (draw-figures.ts); one group per class (4 of them) cost 0.26 × K single runs on 40
  // bench sites with the default ranges, taken together 0.18 × K there.
  if (t) return { key: 'thresholds', label: 'Sparking levels and scatter (every component class)' }
  if (CURRENT_LAW_PATHS.includes(path)) return { key: 'currentLaw', label: 'Peak-current law' }
  if (path === FLASH_DENSITY_FACTOR_PATH) return { key: 'flashDensity', label: 'Flash density' }
  if (path === 'returnStrokeVelocity') return { key: 'coupling', label: 'Coupling (return-stroke velocity)' }
  if (/^ignition/.test(path) || path === 'vapourControlFactor') return { key: 'ignition', label: 'Ignition' }
  if (/^damageRatio\./.test(path)) return { key: 'damage', label: 'Damage ratios' }
  if (/^fireSpread\./.test(path)) return { key: 'fireSpread', label: 'Fire spread' }
  return coarse ? { key: 'other', label: 'Other assumptions' } : { key: path, label: pathLabel(path).label }
}

export interface DrawPlan {
  /** K: the band draws. */
  draws: number
  /** N = ⌊K/2⌋: rows of A, of B and of every A_B^g of the sensitivity design. */
  baseSamples: number
  entries: { path: string; label: string; unit: string }[]
  factors: DrawFactor[]
  central: AssumptionDraw
  /** The K band draws: two independent Latin hypercubes, of ⌈K/2⌉ then ⌊K/2⌋ rows. Matrix A of the design is a[0 … N − 1]. */
  a: AssumptionDraw[]
  /** Matrix B of the design: the second hypercube, a[⌈K/2⌉ …] (the same objects; not evaluated apart). */
  b: AssumptionDraw[]
  /** ab[g][j]: row j of A with factor g's values from B (N rows each). */
  ab: AssumptionDraw[][]
  /** Drawn values of each entry in the K band draws (per entry, K values), for tests and reports. */
  valuesA: Float64Array[]
  /** Damage-ratio standard deviations clamped to stay valid (over every set of the design). */
  clamped: number
  /** Illustrative ranges on assumptions the draws cannot carry, left out (with the reason). */
  leftOut: { path: string; reason: string }[]
}

/** Order of the evaluations of a plan: central, the K band draws (A and B among them), then A_B^g for each factor (N each). */
export function planEvaluations(plan: DrawPlan): AssumptionDraw[] {
  return [plan.central, ...plan.a, ...plan.ab.flat()]
}

export function evaluationCount(plan: Pick<DrawPlan, 'draws' | 'baseSamples' | 'factors'>): number {
  return 1 + plan.draws + plan.baseSamples * plan.factors.length
}

/** Where the design's rows sit among the evaluations (planEvaluations order): f(A), f(B) and each f(A_B^g) start there, N rows each. */
export function designOffsets(plan: Pick<DrawPlan, 'draws' | 'baseSamples' | 'factors'>): { a: number; b: number; ab: number[] } {
  const N = plan.baseSamples
  return { a: 1, b: 1 + Math.ceil(plan.draws / 2), ab: plan.factors.map((_, g) => 1 + plan.draws + g * N) }
}

interface Range { lo: number; hi: number }

/** Valid range of a numeric assumption (the schema's bounds; open ends as measure-zero closed ones). */
export function validRange(path: string): Range {
  if (path === FLASH_DENSITY_FACTOR_PATH) return { lo: 0, hi: Infinity }
  if (path === 'returnStrokeVelocity') return { lo: 0, hi: SPEED_OF_LIGHT_M_PER_S * (1 - 1e-9) }
  if (/^thresholds\.[a-z_]+\.sigma$/.test(path)) return { lo: 0, hi: 3 }
  if (path === 'strikingDistanceB' || path === 'groundStrikingFactor') return { lo: 0, hi: 2 }
  if (/^damageRatio\.[a-z]+\.mean$/.test(path)) return { lo: 0, hi: 1 }
  const meta = assumptionParameterMeta.find((m) => m.key === path)
  if (meta?.unit === 'probability') return { lo: 0, hi: 1 }
  if (path === 'chemicalFlashPointLimitC') return { lo: -Infinity, hi: Infinity }
  return { lo: 0, hi: Infinity }
}

/** Label and unit of a path (the assumption's own, or the reserved flash-density factor's). */
export function pathLabel(path: string): { label: string; unit: string } {
  if (path === FLASH_DENSITY_FACTOR_PATH) return { label: 'Flash density factor (multiplier on every site\'s Ng)', unit: '×' }
  const meta = assumptionParameterMeta.find((m) => m.key === path)
  return meta ? { label: meta.label, unit: meta.unit || '—' } : { label: path, unit: '—' }
}

const DRAWABLE = new Set([
  FLASH_DENSITY_FACTOR_PATH,
  ...assumptionParameterMeta.filter((m) => m.kind === 'number' || m.kind === 'optional_number').map((m) => m.key),
])

/** A marginal: CDF and quantile of the untruncated distribution. */
interface Marginal { cdf(x: number): number; quantile(u: number): number; lo: number; hi: number }

function marginal(d: UncertainDistribution): Marginal {
  switch (d.kind) {
    case 'lognormal': {
      const m = Math.log(d.median)
      return { cdf: (x) => (x <= 0 ? 0 : normalCdf((Math.log(x) - m) / d.sigmaLn)), quantile: (u) => Math.exp(m + d.sigmaLn * normalQuantile(u)), lo: 0, hi: Infinity }
    }
    case 'normal':
      return { cdf: (x) => normalCdf((x - d.mean) / d.sd), quantile: (u) => d.mean + d.sd * normalQuantile(u), lo: d.min ?? -Infinity, hi: d.max ?? Infinity }
    case 'uniform':
      return { cdf: (x) => (x <= d.min ? 0 : x >= d.max ? 1 : (x - d.min) / (d.max - d.min)), quantile: (u) => d.min + u * (d.max - d.min), lo: d.min, hi: d.max }
    case 'triangular': {
      const { min: a, mode: c, max: b } = d
      const fc = (c - a) / (b - a)
      return {
        cdf: (x) => (x <= a ? 0 : x >= b ? 1 : x <= c ? (x - a) ** 2 / ((b - a) * (c - a)) : 1 - (b - x) ** 2 / ((b - a) * (b - c))),
        quantile: (u) => (u < fc ? a + Math.sqrt(u * (b - a) * (c - a)) : b - Math.sqrt((1 - u) * (b - a) * (b - c))),
        lo: a, hi: b,
      }
    }
  }
}

/** Inverse-CDF sampler of an entry on the intersection of its distribution's range and the assumption's valid range. */
export function truncatedSampler(entry: UncertainAssumption): (u: number) => number {
  const m = marginal(entry.distribution)
  const valid = validRange(entry.path)
  const lo = Math.max(m.lo, valid.lo)
  const hi = Math.min(m.hi, valid.hi)
  if (!(lo < hi)) throw new EngineInputError('Invalid assumption uncertainty', [`${entry.path}: its distribution lies outside the valid range of the assumption`])
  const fLo = Number.isFinite(lo) ? m.cdf(lo) : 0
  const fHi = Number.isFinite(hi) ? m.cdf(hi) : 1
  if (!(fHi - fLo > 1e-12)) throw new EngineInputError('Invalid assumption uncertainty', [`${entry.path}: its distribution has (almost) no probability inside the valid range ${lo}–${hi}`])
  return (u) => {
    const x = m.quantile(fLo + u * (fHi - fLo))
    return x < lo ? lo : x > hi ? hi : x
  }
}

/** Lower-triangular L with L·Lᵀ = C; throws when C is not positive definite. */
export function cholesky(c: number[][]): number[][] | null {
  const n = c.length
  const l = c.map(() => new Array<number>(n).fill(0))
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let s = c[i]![j]!
      for (let k = 0; k < j; k++) s -= l[i]![k]! * l[j]![k]!
      if (i === j) {
        if (!(s > 1e-12)) return null
        l[i]![i] = Math.sqrt(s)
      } else l[i]![j] = s / l[j]![j]!
    }
  }
  return l
}

function setPath(target: Record<string, unknown>, path: string, value: number): void {
  const keys = path.split('.')
  let o = target
  for (let i = 0; i < keys.length - 1; i++) o = o[keys[i]!] as Record<string, unknown>
  o[keys.at(-1)!] = value
}

/** Groups of entries linked by correlations (connected components), in entry order. */
function correlationGroups(n: number, links: [number, number][]): number[][] {
  const parent = Array.from({ length: n }, (_, i) => i)
  const find = (i: number): number => (parent[i] === i ? i : (parent[i] = find(parent[i]!)))
  for (const [a, b] of links) parent[find(a)] = find(b)
  const groups = new Map<number, number[]>()
  for (let i = 0; i < n; i++) groups.set(find(i), [...(groups.get(find(i)) ?? []), i])
  return [...groups.values()].sort((x, y) => x[0]! - y[0]!)
}

/** Latin-hypercube standard normals: rows × columns, each column one draw per stratum, shuffled. */
function lhsNormals(rows: number, columns: number, rand: () => number): Float64Array[] {
  return Array.from({ length: columns }, () => {
    const order = Int32Array.from({ length: rows }, (_, i) => i)
    for (let i = rows - 1; i > 0; i--) {
      const j = Math.floor(rand() * (i + 1))
      const t = order[i]!; order[i] = order[j]!; order[j] = t
    }
    return Float64Array.from(order, (k) => normalQuantile((k + rand()) / rows))
  })
}

/**
 * Entries the draws leave out: an illustrative range on an assumption the shared flashes fix (the
 * product's default ranges may cover every assumption) is left out and reported; the same from a
 * calibration or an analyst is refused, because someone meant it.
 */
function leftOutEntries(a: AssumptionSet): { path: string; reason: string }[] {
  return a.uncertainty.entries.filter((e) => e.basis === 'illustrative' && PATHS_REFUSED_FOR_DRAWS[e.path]).map((e) => ({ path: e.path, reason: PATHS_REFUSED_FOR_DRAWS[e.path]! }))
}

/** Validate the uncertainty for draws: every path drawable, correlations positive definite. */
function checkEntries(a: AssumptionSet): string[] {
  const problems: string[] = []
  for (const e of a.uncertainty.entries) {
    if (PATHS_REFUSED_FOR_DRAWS[e.path]) problems.push(`${e.path}: cannot be drawn — ${PATHS_REFUSED_FOR_DRAWS[e.path]}; remove its uncertainty for a run with draws`)
    else if (!DRAWABLE.has(e.path)) problems.push(`${e.path}: not a numeric assumption (see the assumption list) nor "${FLASH_DENSITY_FACTOR_PATH}"`)
    else if (a.currentLaw === 'empirical' && ['powerLawMedianKa', 'powerLawExponent', 'lognormalMedianKa', 'lognormalBeta'].includes(e.path)) {
      problems.push(`${e.path}: the current law is empirical, so its parameters are not used; remove the uncertainty`)
    }
  }
  return problems
}

/**
 * The draw plan of a run: K draws of every uncertain assumption (matrix A), the matrix B and the
 * A_B^g of Saltelli's design. Throws EngineInputError with one line per problem.
 */
export function planAssumptionDraws(central: AssumptionSet, options: { draws: number; runSeed: number | string }): DrawPlan {
  const K = options.draws
  if (!Number.isInteger(K) || K < 2) throw new EngineInputError('Invalid assumption draws', ['the number of draws must be a whole number of at least 2'])
  const leftOut = leftOutEntries(central)
  const skipped = new Set(leftOut.map((l) => l.path))
  const kept = {
    ...central,
    uncertainty: {
      entries: central.uncertainty.entries.filter((e) => !skipped.has(e.path)),
      correlations: central.uncertainty.correlations.filter((c) => !skipped.has(c.a) && !skipped.has(c.b)),
    },
  }
  const entries = kept.uncertainty.entries
  if (entries.length === 0) {
    throw new EngineInputError('Invalid assumption draws', [leftOut.length > 0
      ? `every uncertain assumption of the set is one the draws leave out (${leftOut.map((l) => l.path).join(', ')}): give another assumption an uncertainty, or run without draws`
      : 'the assumption set gives no assumption an uncertainty: add some on the assumptions page, or run without draws'])
  }
  const problems = checkEntries(kept)
  if (problems.length > 0) throw new EngineInputError('Invalid assumption draws', problems)
  const index = new Map(entries.map((e, i) => [e.path, i]))
  const n = entries.length
  const corr: number[][] = entries.map((_, i) => entries.map((__, j) => (i === j ? 1 : 0)))
  const links: [number, number][] = []
  for (const c of kept.uncertainty.correlations) {
    const i = index.get(c.a)!, j = index.get(c.b)!
    corr[i]![j] = c.rho; corr[j]![i] = c.rho
    links.push([i, j])
  }
  // Too many factors for one by one: link the members of each natural group too, so the factors are
  // the natural groups (correlated assumptions always stay in one factor, whatever their groups).
  const grouped = correlationGroups(n, links).length > MAX_SINGLE_FACTORS
  const groupLinks = (coarse: boolean): [number, number][] => {
    const first = new Map<string, number>()
    const out: [number, number][] = []
    entries.forEach((e, i) => {
      const key = naturalGroupOf(e.path, coarse).key
      if (first.has(key)) out.push([first.get(key)!, i])
      else first.set(key, i)
    })
    return out
  }
  const coarse = grouped && correlationGroups(n, [...links, ...groupLinks(false)]).length > MAX_SINGLE_FACTORS
  if (grouped) links.push(...groupLinks(coarse))
  const groups = correlationGroups(n, links)
  const chol = groups.map((g) => {
    const l = cholesky(g.map((i) => g.map((j) => corr[i]![j]!)))
    if (!l) throw new EngineInputError('Invalid assumption draws', [`the correlations among ${g.map((i) => entries[i]!.path).join(', ')} do not form a valid correlation matrix (it is not positive definite): lower some of them`])
    return l
  })
  const samplers = entries.map(truncatedSampler)
  const rand = createStream(options.runSeed, 'assumptions', 'draws')
  const firstRows = Math.ceil(K / 2)
  const N = Math.floor(K / 2)
  const z1 = lhsNormals(firstRows, n, rand)
  const z2 = lhsNormals(N, n, rand)
  // z of input i in band draw j (rows of the first hypercube, then of the second)
  const zBand = (i: number, j: number): number => (j < firstRows ? z1[i]![j]! : z2[i]![j - firstRows]!)
  let clamped = 0

  const build = (z: (i: number) => number): { draw: AssumptionDraw; values: Float64Array } => {
    const values = new Float64Array(n)
    groups.forEach((g, gi) => {
      const l = chol[gi]!
      g.forEach((i, r) => {
        let s = 0
        for (let k = 0; k <= r; k++) s += l[r]![k]! * z(g[k]!)
        values[i] = samplers[i]!(normalCdf(s))
      })
    })
    const set = structuredClone({ ...central, uncertainty: undefined }) as unknown as Record<string, unknown>
    let factor = 1
    entries.forEach((e, i) => {
      if (e.path === FLASH_DENSITY_FACTOR_PATH) factor = values[i]!
      else setPath(set, e.path, values[i]!)
    })
    const dr = set.damageRatio as AssumptionSet['damageRatio']
    for (const c of Object.values(dr)) {
      const limit = Math.sqrt(c.mean * (1 - c.mean))
      if (c.sd > 0 && c.sd >= limit) { c.sd = 0.99 * limit; clamped++ }
    }
    // A drawn set is one point of the uncertainty, not a description of it: it carries none (its
    // value may lie in a tail beyond the 0.1–99.9 % range the set's own check asks of a central value).
    set.uncertainty = emptyUncertainty()
    const checked = assumptionSetSchema.safeParse(set)
    if (!checked.success) throw EngineInputError.fromZod('A drawn assumption set is invalid (narrow the uncertainty)', checked.error)
    return { draw: { assumptions: checked.data, flashDensityFactor: factor }, values }
  }
  const a: AssumptionDraw[] = []
  const valuesA = entries.map(() => new Float64Array(K))
  for (let j = 0; j < K; j++) {
    const row = build((i) => zBand(i, j))
    a.push(row.draw)
    row.values.forEach((v, i) => { valuesA[i]![j] = v })
  }
  const b = a.slice(firstRows, firstRows + N)
  const ab = groups.map((g) => {
    const members = new Set(g)
    return Array.from({ length: N }, (_, j) => build((i) => (members.has(i) ? z2[i]![j]! : z1[i]![j]!)).draw)
  })
  const labelled = entries.map((e) => ({ path: e.path, ...pathLabel(e.path) }))
  const factors = groups.map((g): DrawFactor => {
    const members = g.map((i) => labelled[i]!)
    if (members.length === 1) return { paths: [members[0]!.path], path: members[0]!.path, label: members[0]!.label, unit: members[0]!.unit }
    const paths = members.map((m) => m.path)
    const names = [...new Set(paths.map((p) => naturalGroupOf(p, coarse).label))]
    const label = grouped
      ? `${names.join(' and ')} (group of ${members.length})`
      : `${members.map((m) => m.label).join(' and ')} (correlated, taken together)`
    return { paths, path: paths.join(' + '), label, unit: '—', members }
  })
  return {
    draws: K, baseSamples: N, entries: labelled, factors, leftOut,
    central: { assumptions: central, flashDensityFactor: 1 },
    a, b, ab, valuesA, clamped,
  }
}
