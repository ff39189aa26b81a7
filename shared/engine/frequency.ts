// Frequency mode (MODEL.md §5): per tank, f = λ·E[P(event | I, p)] with conditional probabilities
// (never a coin flip per flash), stratified over current quantiles × annuli centred on the tank,
// Neyman allocation in batches, stopping at a target relative standard error or a sample cap.
import type { ComponentClass, Estimate, SiteInput } from './types'
import type { AssumptionSet } from './assumptions'
import type { PreparedSite } from './kernel'
import type { UniformStream } from './random'
import { attachFlash, canSpark, classSparkProbabilityLn, componentClassOf, strikeRadius, tankSparkGivenAttachment } from './kernel'
import { directStrikeQuadrature, isolatedDirectRadius } from './direct-quadrature'
import type { DirectQuadratureResult } from './direct-quadrature'
import { siteRadius, tankRelevantRadius } from './reach'
import { createStream } from './random'
import { normalEstimate, scaleEstimate, sumEstimates } from './statistics'
import { flashesPerYearOnDisc } from './flash-density'
import { frequencyLosses } from './loss'
import { estimateSpreadLosses } from './spread-frequency'
import type { SitePreparation } from './prepared'
import { prepareSiteOnce } from './prepared'

export interface FrequencyOptions {
  runSeed: number | string
  /** Stop a tank once every non-negligible figure reaches this relative standard error (default 0.02). */
  targetRse?: number
  /** Hard cap on samples per tank (default 400 000). */
  maxSamplesPerTank?: number
  /**
   * The negligible-rate rule: a sampled figure whose upper bound (estimate + 2 SE, or the zero-event
   * bound) is below this is not refined further and is reported as that upper bound only
   * (`Estimate.upperBoundOnly`). Default 1e-5 /yr, once in 100 000 years, far below any figure a
   * ranking or a premium turns on; 0 switches the rule off.
   */
  negligibleRatePerYear?: number
}

/** Default of the negligible-rate rule (/yr). */
export const DEFAULT_NEGLIGIBLE_RATE_PER_YEAR = 1e-5

export interface TankFrequencyResult {
  tankId: string
  tag: string
  direct: Estimate
  sparking: Estimate
  ignition: Estimate
  /** Loss the tank suffers per year: its own fires and fires spreading to it (MODEL.md §4); PD + BI. */
  expectedAnnualLoss: Estimate
  expectedAnnualLossPd: Estimate
  expectedAnnualLossBi: Estimate
  samples: number
  /** True when every figure met the target (or is negligible); false when the sample cap stopped it. */
  converged: boolean
  /** The component class with the largest sparking frequency on its own; null if the tank cannot spark. */
  drivingComponentClass: ComponentClass | null
}

export interface SiteFrequencyResult {
  siteId: string
  mode: 'frequency'
  attachmentModel: PreparedSite['attachmentModel']
  /** R: no flash beyond it can matter (MODEL.md §1). */
  radiusM: number
  /** λ = Ng·πR²·1e-6 flashes per year on that disc. */
  lambdaPerYear: number
  tanks: TankFrequencyResult[]
  totals: { direct: Estimate; sparking: Estimate; ignition: Estimate; expectedAnnualLoss: Estimate; expectedAnnualLossPd: Estimate; expectedAnnualLossBi: Estimate }
  samples: number
}

// Current strata in probability space of the truncated law. Below the median: narrow strata at the
// smallest currents, the only ones that slip past a taller neighbour to strike a tank. Above it:
// strata √2 apart in current, because a flash's reach grows with I and, for a power law, the
// largest currents keep contributing up to Imax however far that is.
const LOWER_CURRENT_BOUNDS = [0, 0.01, 0.03, 0.07, 0.15, 0.25, 0.5]
const UPPER_CURRENT_RATIO = Math.SQRT2
// Annulus edges of the sparking band, in σ around the distance y50 where the tank sparks with
// probability ½ (y = y50·e^{σz}): the band where the conditional probability changes fastest gets
// narrow strata; the direct-strike disc gets three equal-area annuli of its own.
const SPARK_BAND_Z = [-2.5, -1.75, -1.25, -0.75, -0.25, 0.25, 0.75, 1.25, 1.75, 2.5, 3.5]
const INNER_ANNULI = 3
const N_RADIAL = INNER_ANNULI + SPARK_BAND_Z.length + 1
const PILOT_PER_STRATUM = 6
const MIN_BATCH = 1000
/** Every stratum gets at least this many draws in every batch, so each batch estimate covers all strata. */
const MIN_PER_STRATUM = 2
const DEFENSIVE_SHARE = 0.15
/** Least relative error reported for the direct-strike quadrature (measured true errors ≤ 0.2 of it on 200 bench tanks). */
const DIRECT_ERROR_FLOOR = 3e-3
/** … and least absolute error: the quadrature's absolute tolerance (figures far below any that matters). */
const DIRECT_ABSOLUTE_FLOOR_PER_YEAR = 1e-10

/** Current-stratum edges (probability space of the truncated law) for a site's law. */
function currentBounds(ps: PreparedSite): Float64Array {
  const law = ps.law
  const median = law.quantile(0.5)
  const upper: number[] = []
  for (let i = median * UPPER_CURRENT_RATIO; i < law.maxKa / 1.05; i *= UPPER_CURRENT_RATIO) upper.push(law.cdf(i))
  return Float64Array.from([...LOWER_CURRENT_BOUNDS, ...upper.filter((u) => u > 0.5 && u < 1), 1])
}

/** Per-stratum running sums for one tank; h = annulus area × conditional probability. */
class StratumSums {
  readonly n: Float64Array
  readonly area: Float64Array
  readonly areaMax: Float64Array
  readonly s: Float64Array
  readonly s2: Float64Array
  readonly byClass: Float64Array
  constructor(readonly size: number, readonly nClasses: number) {
    this.n = new Float64Array(size); this.area = new Float64Array(size); this.areaMax = new Float64Array(size)
    this.s = new Float64Array(size); this.s2 = new Float64Array(size)
    this.byClass = new Float64Array(size * nClasses)
  }

  /** Add a finished batch into these sums, let `before` see it with the updated totals, then clear it. */
  absorb(batch: StratumSums, before: (batch: StratumSums) => void): void {
    for (let s = 0; s < this.size; s++) {
      this.n[s]! += batch.n[s]!; this.area[s]! += batch.area[s]!
      if (batch.areaMax[s]! > this.areaMax[s]!) this.areaMax[s] = batch.areaMax[s]!
      this.s[s]! += batch.s[s]!; this.s2[s]! += batch.s2[s]!
    }
    for (let i = 0; i < this.byClass.length; i++) this.byClass[i]! += batch.byClass[i]!
    before(batch)
    for (const a of [batch.n, batch.area, batch.areaMax, batch.s, batch.s2, batch.byClass]) a.fill(0)
  }
}

/**
 * Batch estimates pooled with weights proportional to batch size. Each batch's allocation is fixed
 * before it is drawn, so each batch estimate is unbiased; pooling the raw per-stratum sums instead
 * would not be (a stratum whose first draws saw nothing gets few more draws and keeps a low mean).
 * The variance of every batch is recomputed at each look from the per-stratum variances of all
 * draws so far: a batch's own few draws per stratum (the pilot's six) too often miss the rare large
 * values of a skewed stratum, which made early batches look falsely precise.
 */
class BatchPool {
  samples = 0
  sparking = 0
  readonly byClass: Float64Array
  /** Per batch: its size and its draws per stratum. */
  readonly batches: { samples: number; counts: Float64Array }[] = []
  constructor(nClasses: number) { this.byClass = new Float64Array(nClasses) }

  add(batch: Combined, samples: number, counts: Float64Array): void {
    this.samples += samples
    this.sparking += samples * batch.sparking
    this.batches.push({ samples, counts: Float64Array.from(counts) })
    for (let c = 0; c < this.byClass.length; c++) this.byClass[c]! += samples * batch.byClass[c]!
  }

  /** The pooled estimate; allocation scores, zero bounds and stratum variances from all draws so far. */
  estimate(all: Combined): Combined {
    const n = this.samples
    let variance = 0
    for (const b of this.batches) {
      let v = 0
      for (let s = 0; s < b.counts.length; s++) if (b.counts[s]! > 0) v += all.stratumVariance[s]! / b.counts[s]!
      variance += (b.samples / n) ** 2 * v
    }
    return { ...all, sparking: this.sparking / n, varSparking: variance, byClass: this.byClass.map((v) => v / n) }
  }
}

interface TankSampler {
  ps: PreparedSite
  t: number
  rand: UniformStream
  /** Current-stratum edges; stratum s is current stratum ⌊s / N_RADIAL⌋ × annulus s mod N_RADIAL. */
  bounds: Float64Array
  strata: number
  /** Draws of the batch in progress; absorbed into `sums` (all draws) when it ends. */
  batch: StratumSums
  sums: StratumSums
  /** e^{σ z} for the band edges of this tank. */
  bandFactor: Float64Array
  y50PerKa: number
  classFirst: number
}

/**
 * Frequency-mode estimate of every tank of one site. Deterministic in (site, assumptions, runSeed).
 * `prepared`: the site already compiled for this task (prepared.ts), shared with its other figures.
 */
export function simulateSiteFrequency(site: SiteInput, assumptions: AssumptionSet, options: FrequencyOptions, prepared: SitePreparation = prepareSiteOnce(site, assumptions)): SiteFrequencyResult {
  const ps = prepared.ps
  const radiusM = siteRadius(ps)
  const estimated = site.tanks.map((tank, t) => estimateTank(ps, t, createStream(options.runSeed, site.id, `frequency/${tank.id}`), options))
  const spread = estimateSpreadLosses(ps, options.runSeed, undefined, prepared, {
    targetRse: options.targetRse ?? 0.02, ownLossPerYear: estimated.map((r, t) => r.ignition.rate * ps.expectedLoss[t]!.total),
  })
  const losses = frequencyLosses(estimated.map((r) => r.ignition), ps.expectedLoss, spread)
  const tanks = estimated.map((r, t) => {
    // A loss built on an ignition figure stopped by the negligible-rate rule is an upper bound too:
    // its own fires are bounded through the ignition bound, spread from neighbours is added as estimated.
    const bounded = (e: Estimate, key: 'total' | 'propertyDamage' | 'businessInterruption'): Estimate => r.ignition.upperBoundOnly
      ? { ...e, lo: 0, hi: Math.max(e.hi, e.rate + (r.ignition.hi - r.ignition.rate) * ps.expectedLoss[t]![key]), upperBoundOnly: true }
      : e
    return {
      ...r,
      expectedAnnualLoss: bounded(losses.tanks[t]!.total, 'total'),
      expectedAnnualLossPd: bounded(losses.tanks[t]!.propertyDamage, 'propertyDamage'),
      expectedAnnualLossBi: bounded(losses.tanks[t]!.businessInterruption, 'businessInterruption'),
    }
  })
  return {
    siteId: site.id, mode: 'frequency', attachmentModel: ps.attachmentModel, radiusM,
    lambdaPerYear: flashesPerYearOnDisc(ps.flashDensity, radiusM),
    tanks,
    totals: {
      direct: sumEstimates(tanks.map((r) => r.direct)),
      sparking: sumEstimates(tanks.map((r) => r.sparking)),
      ignition: sumEstimates(tanks.map((r) => r.ignition)),
      expectedAnnualLoss: losses.site.total,
      expectedAnnualLossPd: losses.site.propertyDamage,
      expectedAnnualLossBi: losses.site.businessInterruption,
    },
    samples: tanks.reduce((n, r) => n + r.samples, 0),
  }
}

/**
 * One tank: direct strikes by deterministic quadrature (direct-quadrature.ts), induced sparking by
 * the stratified, adaptive sampler.
 */
export function estimateTank(ps: PreparedSite, t: number, rand: UniformStream, options: Omit<FrequencyOptions, 'runSeed'>): TankFrequencyResult {
  const target = options.targetRse ?? 0.02
  const cap = options.maxSamplesPerTank ?? 400_000
  const negligible = options.negligibleRatePerYear ?? DEFAULT_NEGLIGIBLE_RATE_PER_YEAR
  const nClasses = ps.classStart[t + 1]! - ps.classStart[t]!
  const bounds = currentBounds(ps)
  const direct = directStrikeQuadrature(ps, t, bounds)
  const strata = (bounds.length - 1) * N_RADIAL
  const sampler: TankSampler = {
    ps, t, rand, bounds, strata, batch: new StratumSums(strata, nClasses), sums: new StratumSums(strata, nClasses),
    bandFactor: Float64Array.from(SPARK_BAND_Z, (z) => Math.exp(ps.tankSigma[t]! * z)),
    y50PerKa: ps.tankSpark50PerKa[t]!, classFirst: ps.classStart[t]!,
  }
  const scale = ps.flashDensity * 1e-6
  const pool = new BatchPool(nClasses)
  const sparkable = ps.tankSparkable[t] === 1
  let converged = scale === 0 || !sparkable
  let state: FigureState = { settled: converged, growth: 1, negligible: false }
  if (!converged) {
    for (let s = 0; s < strata; s++) runStratum(sampler, s, PILOT_PER_STRATUM)
    closeBatch(sampler, pool, strata * PILOT_PER_STRATUM, scale)
    for (;;) {
      const est = pool.estimate(combine(sampler.sums, bounds, scale))
      state = figureState(est.sparking, est.varSparking, est.sparkingZeroBound, target, negligible)
      // The pilot's six draws per stratum give too rough a variance to stop on (its SE came out
      // ~25 % low on shadowed layouts): a figure meets the target only after an allocated batch.
      if (state.settled && (state.negligible || pool.batches.length >= 2)) { converged = true; break }
      const total = pool.samples
      if (total >= cap) break
      const wanted = state.settled ? MIN_BATCH : Math.ceil(total * state.growth * 1.1) - total
      const batch = Math.min(cap - total, Math.max(MIN_BATCH, Math.min(wanted, 2 * total)))
      closeBatch(sampler, pool, allocateAndRun(sampler, est, batch), scale)
    }
  }
  const final = pool.samples > 0 ? pool.estimate(combine(sampler.sums, bounds, scale)) : combine(sampler.sums, bounds, scale)
  return tankResult(ps, t, direct, final, pool.samples, converged, state.negligible)
}

function closeBatch(sp: TankSampler, pool: BatchPool, samples: number, scale: number): void {
  const means = combine(sp.batch, sp.bounds, scale)
  sp.sums.absorb(sp.batch, (batch) => pool.add(means, samples, batch.n))
}

/** Draw `count` samples in stratum s (current stratum × annulus) and add them to the sums. */
function runStratum(sp: TankSampler, s: number, count: number): void {
  const { ps, t, rand } = sp
  const sums = sp.batch
  const k = (s / N_RADIAL) | 0
  const m = s - k * N_RADIAL
  const uLo = sp.bounds[k]!
  const du = sp.bounds[k + 1]! - uLo
  const tx = ps.objX[t]!
  const ty = ps.objY[t]!
  for (let i = 0; i < count; i++) {
    const lnI = ps.law.logQuantile(uLo + du * rand())
    const current = Math.exp(lnI)
    const rs = strikeRadius(ps, lnI)
    const outer = tankRelevantRadius(ps, t, current, rs)
    const isolated = isolatedDirectRadius(ps, t, rs)
    const inner = isolated < outer ? isolated : outer
    const y50 = canSpark(ps, t, current) ? sp.y50PerKa * current : 0
    const r0 = annulusEdge(sp, m, inner, outer, y50)
    const r1 = annulusEdge(sp, m + 1, inner, outer, y50)
    const ring = r1 * r1 - r0 * r0
    sums.n[s]! += 1
    if (!(ring > 0)) continue
    const area = Math.PI * ring
    const r = Math.sqrt(r0 * r0 + ring * rand())
    sums.area[s]! += area
    if (area > sums.areaMax[s]!) sums.areaMax[s] = area
    // Induced sparking: one direction, attachment resolved against the whole site (a direct strike
    // on t counts as no sparking: MODEL.md §6 integrates sparking over y > D(I)).
    const theta = 2 * Math.PI * rand()
    const px = tx + r * Math.cos(theta)
    const py = ty + r * Math.sin(theta)
    const attached = attachFlash(ps, px, py, rs)
    if (attached === t) continue
    const p = tankSparkGivenAttachment(ps, t, current, lnI, attached, px, py)
    if (p <= 0) continue
    const h = area * p
    sums.s[s]! += h
    sums.s2[s]! += h * h
    if (sums.nClasses > 1) addClassShares(sp, s, area, lnI, attached, px, py)
    else sums.byClass[s]! += h
  }
}

function addClassShares(sp: TankSampler, s: number, area: number, lnI: number, attached: number, px: number, py: number): void {
  const { ps, t } = sp
  const sums = sp.batch
  const qx = attached < 0 ? px : ps.objX[attached]!
  const qy = attached < 0 ? py : ps.objY[attached]!
  const lnY = 0.5 * Math.log((qx - ps.objX[t]!) ** 2 + (qy - ps.objY[t]!) ** 2)
  for (let c = 0; c < sums.nClasses; c++) {
    sums.byClass[s * sums.nClasses + c]! += area * classSparkProbabilityLn(ps, sp.classFirst + c, lnI, lnY)
  }
}

/** Edge e (0 … N_RADIAL) of the annuli at this current: 0, the direct disc in equal areas, the sparking band, R. */
function annulusEdge(sp: TankSampler, e: number, inner: number, outer: number, y50: number): number {
  if (e <= INNER_ANNULI) return inner * Math.sqrt(e / INNER_ANNULI)
  if (e === N_RADIAL) return outer
  const y = y50 * sp.bandFactor[e - INNER_ANNULI - 1]!
  return y < inner ? inner : y > outer ? outer : y
}

interface Combined {
  /** Stratified sparking estimate (per year) and its variance. */
  sparking: number; varSparking: number
  /** 95 % upper bound while no sparking has been seen (rule of three on the stratified sample). */
  sparkingZeroBound: number
  byClass: Float64Array
  /** Per-stratum weight × standard deviation of h (Neyman scores) and weight × largest area. */
  neymanSparking: Float64Array; exposure: Float64Array
  /** Per stratum: (scale · weight)² × sample variance of h, so a stratum's share of a variance is this / its draws. */
  stratumVariance: Float64Array
}

/** Sample variance of h in stratum s. */
function stratumVariance(sums: StratumSums, s: number): number {
  const n = sums.n[s]!
  if (n < 2) return 0
  const ms = sums.s[s]! / n
  return Math.max(0, (sums.s2[s]! - n * ms * ms) / (n - 1))
}

function stratumWeight(bounds: Float64Array, s: number): number {
  const k = (s / N_RADIAL) | 0
  return bounds[k + 1]! - bounds[k]!
}

/** Stratified estimate from `sums` (a batch's draws, or all draws so far). */
function combine(sums: StratumSums, bounds: Float64Array, scale: number): Combined {
  const size = sums.size
  const out: Combined = {
    sparking: 0, varSparking: 0, sparkingZeroBound: 0,
    byClass: new Float64Array(sums.nClasses), neymanSparking: new Float64Array(size), exposure: new Float64Array(size),
    stratumVariance: new Float64Array(size),
  }
  let worst = 0
  for (let s = 0; s < size; s++) {
    const n = sums.n[s]!
    if (n === 0) continue
    const w = stratumWeight(bounds, s)
    const vs = stratumVariance(sums, s)
    out.sparking += w * sums.s[s]! / n
    out.varSparking += w * w * vs / n
    out.stratumVariance[s] = w * w * vs * scale * scale
    out.neymanSparking[s] = w * Math.sqrt(vs)
    out.exposure[s] = w * sums.areaMax[s]!
    // Nothing seen in n_s draws of stratum s: Σ n_s·p_s ≤ 3 at 95 % (rule of three on the whole
    // sample), so the figure w_s·A_s·p_s summed is at most 3·max_s(w_s·A_s / n_s).
    const perDraw = out.exposure[s]! / n
    if (perDraw > worst) worst = perDraw
    for (let c = 0; c < sums.nClasses; c++) out.byClass[c]! += w * sums.byClass[s * sums.nClasses + c]! / n
  }
  out.sparking *= scale
  out.varSparking *= scale * scale
  out.sparkingZeroBound = 3 * worst * scale
  for (let c = 0; c < sums.nClasses; c++) out.byClass[c]! *= scale
  return out
}

interface FigureState {
  settled: boolean
  /** Factor by which the sample count should grow to meet the target. */
  growth: number
  /** Settled by the negligible-rate rule (reported as an upper bound only). */
  negligible: boolean
}

function figureState(rate: number, variance: number, zeroBound: number, target: number, negligible: number): FigureState {
  if (rate === 0) {
    const small = zeroBound < negligible
    return { settled: small, growth: Math.max(1.25, zeroBound / Math.max(negligible, Number.MIN_VALUE)), negligible: small }
  }
  const se = Math.sqrt(variance)
  const rse = se / rate
  if (rse <= target) return { settled: true, growth: 1, negligible: false }
  if (rate + 2 * se < negligible) return { settled: true, growth: 1, negligible: true }
  return { settled: false, growth: Math.max(1, (rse / target) ** 2), negligible: false }
}

/**
 * Allocation of one batch: Neyman shares (weight × standard deviation) — or, while no sparking has
 * been seen, shares by exposure so the rule-of-three bound falls fastest — plus a defensive share
 * by exposure so strata whose pilot saw nothing keep being looked at.
 */
function allocateAndRun(sp: TankSampler, e: Combined, batch: number): number {
  const size = sp.strata
  const share = new Float64Array(size)
  const figures = addShares(share, e.sparking === 0 ? e.exposure : e.neymanSparking)
  const guard = new Float64Array(size)
  addShares(guard, e.exposure)
  // Whole samples per stratum, at least MIN_PER_STRATUM each; the rounding remainder goes to the
  // stratum with the largest share.
  const counts = new Int32Array(size)
  const spread = batch - MIN_PER_STRATUM * size
  let assigned = 0
  let largest = 0
  let largestShare = -1
  for (let s = 0; s < size; s++) {
    const mixed = figures > 0 ? (1 - DEFENSIVE_SHARE) * share[s]! + DEFENSIVE_SHARE * guard[s]! : guard[s]!
    counts[s] = MIN_PER_STRATUM + Math.floor(Math.max(0, spread) * mixed)
    assigned += counts[s]!
    if (mixed > largestShare) { largestShare = mixed; largest = s }
  }
  if (batch > assigned) counts[largest]! += batch - assigned
  for (let s = 0; s < size; s++) runStratum(sp, s, counts[s]!)
  return Math.max(batch, assigned)
}

/** Add `scores` normalised to sum 1; returns 1 if any was added. */
function addShares(into: Float64Array, scores: Float64Array): number {
  let total = 0
  for (let s = 0; s < scores.length; s++) total += scores[s]!
  if (!(total > 0)) return 0
  for (let s = 0; s < scores.length; s++) into[s]! += scores[s]! / total
  return 1
}

/** The figure's upper bound when the negligible-rate rule stopped it: estimate + 2 SE, or the zero-event bound. */
function upperBound(rate: number, variance: number, zeroBound: number): Estimate {
  const se = Math.sqrt(variance)
  return { rate, se, lo: 0, hi: rate === 0 ? zeroBound : rate + 2 * se, upperBoundOnly: true }
}

function tankResult(ps: PreparedSite, t: number, d: DirectQuadratureResult, e: Combined, samples: number, converged: boolean, negligible: boolean): TankFrequencyResult {
  const pid = ps.pIgnDirect[t]!
  const pis = ps.pIgnSpark[t]!
  // The quadrature's error estimate stands in for a standard error, floored at a share of the rate
  // because |K15 − G7| can understate the error where the capture share has kinks (docs/engine.md).
  const direct = normalEstimate(d.ratePerYear, Math.max(d.errorPerYear, DIRECT_ERROR_FLOOR * d.ratePerYear, d.ratePerYear > 0 ? DIRECT_ABSOLUTE_FLOOR_PER_YEAR : 0))
  const sparking = ps.tankSparkable[t] !== 1
    ? normalEstimate(0, 0)
    : negligible ? upperBound(e.sparking, e.varSparking, e.sparkingZeroBound)
      : e.sparking === 0 ? { rate: 0, se: 0, lo: 0, hi: e.sparkingZeroBound } : normalEstimate(e.sparking, Math.sqrt(e.varSparking))
  // Direct strikes come from quadrature, sparking from sampling: the two errors are independent.
  const ignitionRate = pid * direct.rate + pis * sparking.rate
  const ignitionSe = Math.sqrt(pid * pid * direct.se * direct.se + pis * pis * sparking.se * sparking.se)
  const ignition: Estimate = negligible && pis > 0
    ? { rate: ignitionRate, se: ignitionSe, lo: 0, hi: pid * direct.hi + pis * sparking.hi, upperBoundOnly: true }
    : ignitionRate === 0 && (pid > 0 || pis > 0)
      ? { rate: 0, se: 0, lo: 0, hi: pid * direct.hi + pis * sparking.hi }
      : normalEstimate(ignitionRate, ignitionSe)
  return {
    tankId: ps.tanks[t]!.id, tag: ps.tanks[t]!.tag,
    direct, sparking, ignition,
    // Own fires only; simulateSiteFrequency adds the spread and the PD / BI split (loss.ts).
    expectedAnnualLoss: scaleEstimate(ignition, ps.expectedLoss[t]!.total),
    expectedAnnualLossPd: scaleEstimate(ignition, ps.expectedLoss[t]!.propertyDamage),
    expectedAnnualLossBi: scaleEstimate(ignition, ps.expectedLoss[t]!.businessInterruption),
    samples, converged,
    drivingComponentClass: drivingClass(ps, t, e.byClass),
  }
}

function drivingClass(ps: PreparedSite, t: number, byClass: Float64Array): ComponentClass | null {
  let best = -1
  let bestRate = 0
  for (let c = 0; c < byClass.length; c++) if (byClass[c]! > bestRate) { bestRate = byClass[c]!; best = c }
  return best < 0 ? null : componentClassOf(ps, ps.classStart[t]! + best)
}

/**
 * Crude Monte Carlo baseline (for the benchmark and tests only): current from the law, flash point
 * uniform on the site's disc of radius R, conditional probabilities — no stratification.
 */
export function crudeTankEstimate(ps: PreparedSite, t: number, samples: number, rand: UniformStream): { direct: Estimate; sparking: Estimate } {
  const radius = siteRadius(ps)
  const area = Math.PI * radius * radius
  let sd = 0, sd2 = 0, ss = 0, ss2 = 0
  for (let i = 0; i < samples; i++) {
    const current = ps.law.quantile(rand())
    const lnI = Math.log(current)
    const r = radius * Math.sqrt(rand())
    const theta = 2 * Math.PI * rand()
    const px = r * Math.cos(theta)
    const py = r * Math.sin(theta)
    const attached = attachFlash(ps, px, py, strikeRadius(ps, lnI))
    if (attached === t) { sd += 1; sd2 += 1; continue }
    const p = tankSparkGivenAttachment(ps, t, current, lnI, attached, px, py)
    ss += p; ss2 += p * p
  }
  const scale = ps.flashDensity * 1e-6 * area
  const est = (sum: number, sum2: number): Estimate => {
    const mean = sum / samples
    const variance = Math.max(0, (sum2 - samples * mean * mean) / (samples - 1))
    return normalEstimate(scale * mean, scale * Math.sqrt(variance / samples))
  }
  return { direct: est(sd, sd2), sparking: est(ss, ss2) }
}
