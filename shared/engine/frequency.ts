// Frequency mode (MODEL.md §5): per tank, f = λ·E[P(event | I, p)] with conditional probabilities
// (never a coin flip per flash), stratified over current quantiles × annuli centred on the tank,
// Neyman allocation in batches, stopping at a target relative standard error or a sample cap.
import type { ComponentClass, Estimate, SiteInput } from './types'
import type { AssumptionSet } from './assumptions'
import type { ArcScratch, PreparedSite } from './kernel'
import type { UniformStream } from './random'
import { attachFlash, canSpark, classSparkProbabilityLn, componentClassOf, createArcScratch, directCaptureFraction, prepareSite, strikeRadius, tankSparkGivenAttachment } from './kernel'
import { siteRadius, tankRelevantRadius } from './reach'
import { createStream } from './random'
import { normalEstimate, scaleEstimate, sumEstimates } from './statistics'
import { flashesPerYearOnDisc } from './flash-density'
import { frequencyLosses } from './loss'
import { estimateSpreadLosses } from './spread-frequency'

export interface FrequencyOptions {
  runSeed: number | string
  /** Stop a tank once every non-negligible figure reaches this relative standard error (default 0.02). */
  targetRse?: number
  /** Hard cap on samples per tank (default 400 000). */
  maxSamplesPerTank?: number
  /**
   * Figures whose upper bound (estimate + 2 SE) is below this are not refined further: default
   * 1e-5 /yr, once in 100 000 years, far below any figure a ranking or a premium turns on.
   */
  negligibleRatePerYear?: number
}

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
  readonly d: Float64Array
  readonly d2: Float64Array
  readonly s: Float64Array
  readonly s2: Float64Array
  readonly ds: Float64Array
  readonly byClass: Float64Array
  constructor(readonly size: number, readonly nClasses: number) {
    this.n = new Float64Array(size); this.area = new Float64Array(size); this.areaMax = new Float64Array(size)
    this.d = new Float64Array(size); this.d2 = new Float64Array(size); this.s = new Float64Array(size); this.s2 = new Float64Array(size); this.ds = new Float64Array(size)
    this.byClass = new Float64Array(size * nClasses)
  }

  /** Add a finished batch into these sums, let `before` see it with the updated totals, then clear it. */
  absorb(batch: StratumSums, before: (batch: StratumSums) => void): void {
    for (let s = 0; s < this.size; s++) {
      this.n[s]! += batch.n[s]!; this.area[s]! += batch.area[s]!
      if (batch.areaMax[s]! > this.areaMax[s]!) this.areaMax[s] = batch.areaMax[s]!
      this.d[s]! += batch.d[s]!; this.d2[s]! += batch.d2[s]!; this.s[s]! += batch.s[s]!; this.s2[s]! += batch.s2[s]!; this.ds[s]! += batch.ds[s]!
    }
    for (let i = 0; i < this.byClass.length; i++) this.byClass[i]! += batch.byClass[i]!
    before(batch)
    for (const a of [batch.n, batch.area, batch.areaMax, batch.d, batch.d2, batch.s, batch.s2, batch.ds, batch.byClass]) a.fill(0)
  }
}

/**
 * Batch estimates pooled with weights proportional to batch size. Each batch's allocation is fixed
 * before it is drawn, so each batch estimate is unbiased; pooling the raw per-stratum sums instead
 * would not be (a stratum whose first draws saw nothing gets few more draws and keeps a low mean).
 */
class BatchPool {
  samples = 0
  direct = 0; sparking = 0; varDirect = 0; varSparking = 0; covariance = 0
  readonly byClass: Float64Array
  constructor(nClasses: number) { this.byClass = new Float64Array(nClasses) }

  add(batch: Combined, samples: number): void {
    this.samples += samples
    this.direct += samples * batch.direct
    this.sparking += samples * batch.sparking
    this.varDirect += samples * samples * batch.varDirect
    this.varSparking += samples * samples * batch.varSparking
    this.covariance += samples * samples * batch.covariance
    for (let c = 0; c < this.byClass.length; c++) this.byClass[c]! += samples * batch.byClass[c]!
  }

  /** The pooled estimate, with allocation scores and zero bounds taken from all draws so far. */
  estimate(all: Combined): Combined {
    const n = this.samples
    return {
      ...all,
      direct: this.direct / n, sparking: this.sparking / n,
      varDirect: this.varDirect / (n * n), varSparking: this.varSparking / (n * n), covariance: this.covariance / (n * n),
      byClass: this.byClass.map((v) => v / n),
    }
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
  arcs: ArcScratch
}

/** Frequency-mode estimate of every tank of one site. Deterministic in (site, assumptions, runSeed). */
export function simulateSiteFrequency(site: SiteInput, assumptions: AssumptionSet, options: FrequencyOptions): SiteFrequencyResult {
  const ps = prepareSite(site, assumptions)
  const radiusM = siteRadius(ps)
  const estimated = site.tanks.map((tank, t) => estimateTank(ps, t, createStream(options.runSeed, site.id, `frequency/${tank.id}`), options))
  const losses = frequencyLosses(estimated.map((r) => r.ignition), ps.expectedLoss, estimateSpreadLosses(ps, options.runSeed))
  const tanks = estimated.map((r, t) => ({
    ...r, expectedAnnualLoss: losses.tanks[t]!.total, expectedAnnualLossPd: losses.tanks[t]!.propertyDamage, expectedAnnualLossBi: losses.tanks[t]!.businessInterruption,
  }))
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

/** Stratified, adaptive estimate for tank t of a prepared site. */
export function estimateTank(ps: PreparedSite, t: number, rand: UniformStream, options: Omit<FrequencyOptions, 'runSeed'>): TankFrequencyResult {
  const target = options.targetRse ?? 0.02
  const cap = options.maxSamplesPerTank ?? 400_000
  const negligible = options.negligibleRatePerYear ?? 1e-5
  const nClasses = ps.classStart[t + 1]! - ps.classStart[t]!
  const bounds = currentBounds(ps)
  const strata = (bounds.length - 1) * N_RADIAL
  const sampler: TankSampler = {
    ps, t, rand, bounds, strata, batch: new StratumSums(strata, nClasses), sums: new StratumSums(strata, nClasses),
    bandFactor: Float64Array.from(SPARK_BAND_Z, (z) => Math.exp(ps.tankSigma[t]! * z)),
    y50PerKa: ps.tankSpark50PerKa[t]!, classFirst: ps.classStart[t]!, arcs: createArcScratch(ps),
  }
  const scale = ps.flashDensity * 1e-6
  const pool = new BatchPool(nClasses)
  let converged = scale === 0
  if (!converged) {
    for (let s = 0; s < strata; s++) runStratum(sampler, s, PILOT_PER_STRATUM)
    closeBatch(sampler, pool, strata * PILOT_PER_STRATUM, scale)
    for (;;) {
      const est = pool.estimate(combine(sampler.sums, bounds, scale))
      const state = convergence(est, ps.tankSparkable[t] === 1, target, negligible)
      if (state.settled) { converged = true; break }
      const total = pool.samples
      if (total >= cap) break
      const wanted = Math.ceil(total * state.growth * 1.1) - total
      const batch = Math.min(cap - total, Math.max(MIN_BATCH, Math.min(wanted, 2 * total)))
      closeBatch(sampler, pool, allocateAndRun(sampler, est, state, batch), scale)
    }
  }
  const final = pool.samples > 0 ? pool.estimate(combine(sampler.sums, bounds, scale)) : combine(sampler.sums, bounds, scale)
  return tankResult(ps, t, final, pool.samples, converged)
}

function closeBatch(sp: TankSampler, pool: BatchPool, samples: number, scale: number): void {
  const means = combine(sp.batch, sp.bounds, scale)
  sp.sums.absorb(sp.batch, (batch) => pool.add({ ...means, ...varianceOnly(combine(batch, sp.bounds, scale, sp.sums)) }, samples))
}

function varianceOnly(c: Combined): Pick<Combined, 'varDirect' | 'varSparking' | 'covariance'> {
  return { varDirect: c.varDirect, varSparking: c.varSparking, covariance: c.covariance }
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
    const inner = directDiscRadius(ps, t, rs, outer)
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
    // Direct strikes: the exact share of directions at this distance (no coin flip over the angle).
    const direct = m < INNER_ANNULI ? area * directCaptureFraction(ps, t, rs, r, sp.arcs) : 0
    sums.d[s]! += direct
    sums.d2[s]! += direct * direct
    // Induced sparking: one direction, attachment resolved against the whole site.
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
    sums.ds[s]! += direct * h
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

/** Radius of the disc that holds every direct strike on tank t (its isolated capture distance). */
function directDiscRadius(ps: PreparedSite, t: number, rs: number, outer: number): number {
  let d: number
  if (ps.attachmentModel === 'collection_area') d = ps.objRadius[t]! + 3 * ps.objHeight[t]!
  else {
    const rg = ps.groundFactor * rs
    const h = ps.objHeight[t]!
    const gap = rg - h
    d = h >= rg ? ps.objRadius[t]! + rs : gap >= rs ? 0 : ps.objRadius[t]! + Math.sqrt(rs * rs - gap * gap)
  }
  return d < outer ? d : outer
}

/** Edge e (0 … N_RADIAL) of the annuli at this current: 0, the direct disc in equal areas, the sparking band, R. */
function annulusEdge(sp: TankSampler, e: number, inner: number, outer: number, y50: number): number {
  if (e <= INNER_ANNULI) return inner * Math.sqrt(e / INNER_ANNULI)
  if (e === N_RADIAL) return outer
  const y = y50 * sp.bandFactor[e - INNER_ANNULI - 1]!
  return y < inner ? inner : y > outer ? outer : y
}

interface Combined {
  /** Stratified estimates (per year) and their variances for direct, sparking and their covariance. */
  direct: number; sparking: number; varDirect: number; varSparking: number; covariance: number
  /** 95 % upper bounds for figures with no event seen yet (rule of three on the stratified sample). */
  directZeroBound: number; sparkingZeroBound: number
  byClass: Float64Array
  /** Per-stratum weight × standard deviation of h (Neyman scores) and weight × largest area. */
  neymanDirect: Float64Array; neymanSparking: Float64Array; exposure: Float64Array
}

/** Sample variances of h for direct and sparking and their covariance in stratum s. */
function stratumSpread(sums: StratumSums, s: number): { vd: number; vs: number; cov: number } {
  const n = sums.n[s]!
  if (n < 2) return { vd: 0, vs: 0, cov: 0 }
  const md = sums.d[s]! / n
  const ms = sums.s[s]! / n
  return {
    vd: Math.max(0, (sums.d2[s]! - n * md * md) / (n - 1)),
    vs: Math.max(0, (sums.s2[s]! - n * ms * ms) / (n - 1)),
    cov: (sums.ds[s]! - n * md * ms) / (n - 1),
  }
}

function stratumWeight(bounds: Float64Array, s: number): number {
  const k = (s / N_RADIAL) | 0
  return bounds[k + 1]! - bounds[k]!
}

function isDirectStratum(s: number): boolean {
  return s % N_RADIAL < INNER_ANNULI
}

/**
 * Stratified estimate from `sums`. The per-stratum variances come from `spread` (default: the same
 * sums); a batch passes all draws so far, because a variance from a batch's few draws per stratum
 * is too often zero in strata where events are rare.
 */
function combine(sums: StratumSums, bounds: Float64Array, scale: number, spread: StratumSums = sums): Combined {
  const size = sums.size
  const out: Combined = {
    direct: 0, sparking: 0, varDirect: 0, varSparking: 0, covariance: 0, directZeroBound: 0, sparkingZeroBound: 0,
    byClass: new Float64Array(sums.nClasses), neymanDirect: new Float64Array(size), neymanSparking: new Float64Array(size), exposure: new Float64Array(size),
  }
  let worstDirect = 0
  let worstSparking = 0
  for (let s = 0; s < size; s++) {
    const n = sums.n[s]!
    if (n === 0) continue
    const w = stratumWeight(bounds, s)
    const md = sums.d[s]! / n
    const ms = sums.s[s]! / n
    const { vd, vs, cov } = stratumSpread(spread, s)
    out.direct += w * md
    out.sparking += w * ms
    out.varDirect += w * w * vd / n
    out.varSparking += w * w * vs / n
    out.covariance += w * w * cov / n
    out.neymanDirect[s] = w * Math.sqrt(vd)
    out.neymanSparking[s] = w * Math.sqrt(vs)
    out.exposure[s] = w * sums.areaMax[s]!
    // Nothing seen in n_s draws of stratum s: Σ n_s·p_s ≤ 3 at 95 % (rule of three on the whole
    // sample), so the figure w_s·A_s·p_s summed is at most 3·max_s(w_s·A_s / n_s).
    const perDraw = out.exposure[s]! / n
    if (isDirectStratum(s) && perDraw > worstDirect) worstDirect = perDraw
    if (perDraw > worstSparking) worstSparking = perDraw
    for (let c = 0; c < sums.nClasses; c++) out.byClass[c]! += w * sums.byClass[s * sums.nClasses + c]! / n
  }
  const scale2 = scale * scale
  out.direct *= scale; out.sparking *= scale
  out.varDirect *= scale2; out.varSparking *= scale2; out.covariance *= scale2
  out.directZeroBound = 3 * worstDirect * scale
  out.sparkingZeroBound = 3 * worstSparking * scale
  for (let c = 0; c < sums.nClasses; c++) out.byClass[c]! *= scale
  return out
}

interface FigureState { settled: boolean; growth: number }

interface ConvergenceState {
  settled: boolean
  /** Factor by which the sample count should grow to meet the target. */
  growth: number
  direct: FigureState
  sparking: FigureState
}

function convergence(e: Combined, sparkable: boolean, target: number, negligible: number): ConvergenceState {
  const direct = figureState(e.direct, e.varDirect, e.directZeroBound, target, negligible)
  const sparking = sparkable ? figureState(e.sparking, e.varSparking, e.sparkingZeroBound, target, negligible) : { settled: true, growth: 1 }
  return {
    settled: direct.settled && sparking.settled,
    growth: Math.max(direct.settled ? 1 : direct.growth, sparking.settled ? 1 : sparking.growth),
    direct, sparking,
  }
}

function figureState(rate: number, variance: number, zeroBound: number, target: number, negligible: number): FigureState {
  if (rate === 0) return { settled: zeroBound < negligible, growth: Math.max(1.25, zeroBound / negligible) }
  const se = Math.sqrt(variance)
  if (rate + 2 * se < negligible) return { settled: true, growth: 1 }
  const rse = se / rate
  return { settled: rse <= target, growth: Math.max(1, (rse / target) ** 2) }
}

/**
 * Allocation of one batch: for each figure still being refined, Neyman shares (weight × standard
 * deviation) — or, while it has seen no event, shares by exposure so the rule-of-three bound falls
 * fastest — averaged over those figures; plus a defensive share by exposure so strata whose pilot
 * saw nothing keep being looked at.
 */
function allocateAndRun(sp: TankSampler, e: Combined, state: ConvergenceState, batch: number): number {
  const size = sp.strata
  const share = new Float64Array(size)
  let figures = 0
  if (!state.direct.settled) figures += addShares(share, e.direct === 0 ? e.exposure : e.neymanDirect, e.direct === 0 ? isDirectStratum : null)
  if (!state.sparking.settled) figures += addShares(share, e.sparking === 0 ? e.exposure : e.neymanSparking, null)
  const guard = new Float64Array(size)
  addShares(guard, e.exposure, null)
  // Whole samples per stratum, at least MIN_PER_STRATUM each; the rounding remainder goes to the
  // stratum with the largest share.
  const counts = new Int32Array(size)
  const spread = batch - MIN_PER_STRATUM * size
  let assigned = 0
  let largest = 0
  let largestShare = -1
  for (let s = 0; s < size; s++) {
    const mixed = figures > 0 ? (1 - DEFENSIVE_SHARE) * share[s]! / figures + DEFENSIVE_SHARE * guard[s]! : guard[s]!
    counts[s] = MIN_PER_STRATUM + Math.floor(Math.max(0, spread) * mixed)
    assigned += counts[s]!
    if (mixed > largestShare) { largestShare = mixed; largest = s }
  }
  if (batch > assigned) counts[largest]! += batch - assigned
  for (let s = 0; s < size; s++) runStratum(sp, s, counts[s]!)
  return Math.max(batch, assigned)
}

/** Add `scores` (restricted to strata passing `keep`) normalised to sum 1; returns 1 if any was added. */
function addShares(into: Float64Array, scores: Float64Array, keep: ((s: number) => boolean) | null): number {
  let total = 0
  for (let s = 0; s < scores.length; s++) if (keep === null || keep(s)) total += scores[s]!
  if (!(total > 0)) return 0
  for (let s = 0; s < scores.length; s++) if (keep === null || keep(s)) into[s]! += scores[s]! / total
  return 1
}

function tankResult(ps: PreparedSite, t: number, e: Combined, samples: number, converged: boolean): TankFrequencyResult {
  const pid = ps.pIgnDirect[t]!
  const pis = ps.pIgnSpark[t]!
  const direct = figureEstimate(e.direct, e.varDirect, e.directZeroBound)
  const sparking = ps.tankSparkable[t] === 1 ? figureEstimate(e.sparking, e.varSparking, e.sparkingZeroBound) : normalEstimate(0, 0)
  const ignitionRate = pid * e.direct + pis * e.sparking
  const ignitionVar = pid * pid * e.varDirect + pis * pis * e.varSparking + 2 * pid * pis * e.covariance
  const ignition = ignitionRate === 0 && (pid > 0 || pis > 0)
    ? { rate: 0, se: 0, lo: 0, hi: pid * direct.hi + pis * sparking.hi }
    : normalEstimate(ignitionRate, Math.sqrt(Math.max(0, ignitionVar)))
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

function figureEstimate(rate: number, variance: number, zeroBound: number): Estimate {
  return rate === 0 ? { rate: 0, se: 0, lo: 0, hi: zeroBound } : normalEstimate(rate, Math.sqrt(variance))
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
