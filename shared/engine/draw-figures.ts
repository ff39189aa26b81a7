// Figures of every assumption draw on common random numbers (issue "How sure are we").
//
// One set of flash samples per site serves the central assumptions and every draw, so the
// differences between draws are the assumptions' effect, not sampling noise. For each shared flash
// the engine keeps what no drawn value changes — its current, its attachment (striking distance,
// attachment rule, Imin and Imax are never drawn: draws.ts refuses them), which tank it strikes,
// and per component class of every tank it can make spark x = ln I + ln h − ln max(y, floor), the
// induced potential for a coupling of 1 Ω in log form. Each draw then re-evaluates only what
// depends on its values: the sparking probability Φ((x + ln Kc − ln U50)/σ) per class, ignition
// given a spark or a strike, the expected loss of a fire (damage ratios), fire spread to neighbours
// (the spread table), the flash density (a factor) and the current law by importance re-weighting
// (likelihood ratio of the drawn truncated density of ln I to the sampled one).
//
// Sampling: N flashes per site, currents Latin-hypercube stratified in probability of the central
// truncated law; ground points from a defensive mixture about each tank (uniform on its relevant
// disc, log-uniform in distance, uniform on its isolated capture disc), the relevant disc widened
// to the most permissive drawn sparking level, scatter and coupling so no draw sparks outside it.
// The weight of a flash is 1 / (mixture density) (m²).
//
// A figure's band value for draw k is central × X_k / X_0, with X_0 the same estimator at the
// central assumptions: the ratio of two estimates on the same flashes is far more precise than
// either, and with only the flash-density factor uncertain it is exactly the factor × central.
import type { AssumptionSet } from './assumptions'
import type { AssumptionDraw, DrawPlan } from './draws'
import { designOffsets, planEvaluations } from './draws'
import type { SiteInput } from './types'
import type { PreparedSite } from './kernel'
import { attachFlash, canSpark, lawSpec, phi, prepareSite, strikeRadius } from './kernel'
import { couplingCoefficient } from './induction'
import { currentLawFromSpec } from './current'
import { hasInducedSparking, ignitionGivenDirect, ignitionGivenSpark } from './ignition'
import { expectedBurningTankLoss, spreadTable } from './loss'
import { isolatedDirectRadius } from './direct-quadrature'
import { tankRelevantRadius } from './reach'
import { createStream } from './random'
import type { SensitivityResult } from './sensitivity'
import { sobolIndices } from './sensitivity'

/** Shared flashes drawn per site (default). */
export const DRAW_FLASHES_PER_SITE = 4000

/** The four figures per tank, in this order in the value arrays. */
export const DRAW_METRICS = ['direct', 'sparking', 'ignition', 'expectedAnnualLoss'] as const
export type DrawMetric = typeof DRAW_METRICS[number]
const M = DRAW_METRICS.length

/** 5 %, 50 % and 95 % points across the draws (Hyndman & Fan type 7 quantiles). */
export interface DrawBand { p05: number; p50: number; p95: number }

export interface SiteDrawValues {
  evaluations: number
  nTanks: number
  /** values[(e·nTanks + t)·4 + m]: figure m of tank t under evaluation e (planEvaluations order). */
  values: Float64Array
  /** Shared flashes kept (those that can give some tank an event under some draw). */
  flashes: number
  /** The flash-density factor of each evaluation. */
  factors: Float64Array
}

const LAW_PATHS: Record<AssumptionSet['currentLaw'], string[]> = {
  power_law: ['powerLawMedianKa', 'powerLawExponent'],
  lognormal: ['lognormalMedianKa', 'lognormalBeta'],
  empirical: [],
}

/** ln of the truncated density of ln I at each of `lnI` under a set's parametric law (closed forms; 0 for the empirical law). */
function logDensities(a: AssumptionSet, lnI: Float64Array): Float64Array {
  const law = currentLawFromSpec(lawSpec(a))
  const lnMass = Math.log(law.cdf(a.currentMaxKa) - law.cdf(a.currentMinKa))
  const out = new Float64Array(lnI.length)
  if (a.currentLaw === 'power_law') {
    // f(s) = k·x/(1 + x)², x = (I/M)^k (IEEE Std 1410 power law, density of ln I)
    const k = a.powerLawExponent, lnM = Math.log(a.powerLawMedianKa), lnK = Math.log(k)
    for (let f = 0; f < lnI.length; f++) {
      const kx = k * (lnI[f]! - lnM)
      out[f] = lnK + kx - 2 * Math.log1p(Math.exp(kx)) - lnMass
    }
  } else if (a.currentLaw === 'lognormal') {
    const lnM = Math.log(a.lognormalMedianKa), beta = a.lognormalBeta, c = -Math.log(beta * Math.sqrt(2 * Math.PI))
    for (let f = 0; f < lnI.length; f++) {
      const z = (lnI[f]! - lnM) / beta
      out[f] = c - 0.5 * z * z - lnMass
    }
  }
  return out
}

/** The most permissive sparking level ÷ coupling and the widest scatter over every evaluation, per class. */
function widenedAssumptions(central: AssumptionSet, sets: readonly AssumptionDraw[]): AssumptionSet {
  const kc0 = couplingCoefficient(central)
  const thresholds = structuredClone(central.thresholds)
  for (const cls of Object.keys(thresholds) as (keyof typeof thresholds)[]) {
    for (const d of sets) {
      const th = d.assumptions.thresholds[cls]
      const u50AtCentralCoupling = th.u50Kv * kc0 / couplingCoefficient(d.assumptions)
      if (u50AtCentralCoupling < thresholds[cls].u50Kv) thresholds[cls].u50Kv = u50AtCentralCoupling
      if (th.sigma > thresholds[cls].sigma) thresholds[cls].sigma = th.sigma
    }
  }
  return { ...central, thresholds }
}

interface FlashRecords {
  weight: Float64Array
  lnI: Float64Array
  /** events of flash f: evStart[f] … evStart[f+1]. */
  evStart: Int32Array
  evTank: Int32Array
  /** −1: a direct strike on the tank; otherwise the offset in classX of the tank's first class. */
  evClassX: Int32Array
  classX: Float64Array
}

/**
 * Φ(−5.6) ≈ 1e-8: a class this far below its threshold is taken not to spark — a hundredth of the
 * engine's own cutoff probability (1e-6 by default), beyond which the frequency mode does not
 * simulate flashes at all.
 */
const Z_NEGLIGIBLE = -5.6

function sampleFlashes(site: SiteInput, ps: PreparedSite, wide: PreparedSite, samples: number, runSeed: number | string): FlashRecords {
  const rand = createStream(runSeed, site.id, 'draws/flashes')
  const nT = ps.nTanks
  const order = Int32Array.from({ length: samples }, (_, i) => i)
  for (let i = samples - 1; i > 0; i--) {
    const j = Math.floor(rand() * (i + 1))
    const t = order[i]!; order[i] = order[j]!; order[j] = t
  }
  const weight: number[] = [], lnIs: number[] = [], evStart: number[] = [0], evTank: number[] = [], evClassX: number[] = [], classX: number[] = []
  const R = new Float64Array(nT), D = new Float64Array(nT), r0 = new Float64Array(nT)
  const wideCoefMax = new Float64Array(ps.classLogCoef.length)
  const wideInvSigma = wide.classInvSigma
  for (let c = 0; c < wideCoefMax.length; c++) wideCoefMax[c] = wide.classLogCoef[c]!
  for (let f = 0; f < samples; f++) {
    const lnI = ps.law.logQuantile((order[f]! + rand()) / samples)
    const current = Math.exp(lnI)
    const rs = strikeRadius(ps, lnI)
    for (let t = 0; t < nT; t++) {
      R[t] = Math.max(tankRelevantRadius(wide, t, current, rs), tankRelevantRadius(ps, t, current, rs))
      D[t] = Math.min(isolatedDirectRadius(ps, t, rs), R[t]!)
      r0[t] = Math.max(0.5, ps.objRadius[t]!)
    }
    // Pick a tank, a component of the mixture and a point.
    const t0 = Math.min(nT - 1, Math.floor(rand() * nT))
    const comp = rand()
    const theta = 2 * Math.PI * rand()
    const v = rand()
    const logOk = R[t0]! > r0[t0]!
    let r: number
    if (comp < 1 / 3 || (!logOk && comp < 2 / 3) || (D[t0]! <= 0 && comp >= 2 / 3)) r = R[t0]! * Math.sqrt(v)
    else if (comp < 2 / 3) r = r0[t0]! * Math.exp(v * Math.log(R[t0]! / r0[t0]!))
    else r = D[t0]! * Math.sqrt(v)
    const px = ps.objX[t0]! + r * Math.cos(theta)
    const py = ps.objY[t0]! + r * Math.sin(theta)
    // Mixture density at the point (per m²), averaged over the tanks.
    let q = 0
    for (let t = 0; t < nT; t++) {
      const d = Math.hypot(px - ps.objX[t]!, py - ps.objY[t]!)
      const Rt = R[t]!
      if (d > Rt) continue
      const lt = Rt > r0[t]!
      const hasD = D[t]! > 0
      // the same component choice as above, as weights
      const wU = 1 / 3 + (lt ? 0 : 1 / 3) + (hasD ? 0 : 1 / 3)
      q += wU / (Math.PI * Rt * Rt)
      if (lt && d >= r0[t]!) q += (1 / 3) / (2 * Math.PI * d * d * Math.log(Rt / r0[t]!))
      if (hasD && d <= D[t]!) q += (1 / 3) / (Math.PI * D[t]! * D[t]!)
    }
    q /= nT
    if (!(q > 0)) continue
    const attached = attachFlash(ps, px, py, rs)
    const before = evTank.length
    for (let t = 0; t < nT; t++) {
      if (attached === t) { evTank.push(t); evClassX.push(-1); continue }
      if (!canSpark(ps, t, current)) continue
      const qx = attached < 0 ? px : ps.objX[attached]!
      const qy = attached < 0 ? py : ps.objY[attached]!
      const d2 = (qx - ps.objX[t]!) ** 2 + (qy - ps.objY[t]!) ** 2
      const lnY = d2 > 0 ? 0.5 * Math.log(d2) : -745
      const first = ps.classStart[t]!, end = ps.classStart[t + 1]!
      let any = false
      const xs: number[] = []
      for (let c = first; c < end; c++) {
        const floor = ps.classLogFloor[c]!
        // x = ln I + ln h − ln max(y, floor): classLogCoef = ln(Kc·h/U50), so ln h = classLogCoef − ln Kc + ln U50.
        const x = lnI - (lnY > floor ? lnY : floor)
        xs.push(x)
        if ((x + wideCoefMax[c]!) * wideInvSigma[c]! > Z_NEGLIGIBLE) any = true
      }
      if (!any) continue
      evTank.push(t); evClassX.push(classX.length)
      classX.push(...xs)
    }
    if (evTank.length === before) continue
    weight.push(1 / q); lnIs.push(lnI); evStart.push(evTank.length)
  }
  return {
    weight: Float64Array.from(weight), lnI: Float64Array.from(lnIs), evStart: Int32Array.from(evStart),
    evTank: Int32Array.from(evTank), evClassX: Int32Array.from(evClassX), classX: Float64Array.from(classX),
  }
}

/**
 * Every tank's four figures under the central assumptions and every draw of the plan, on one set of
 * shared flashes (`samples` per site). Deterministic in (site, plan, runSeed).
 */
export function siteDrawValues(site: SiteInput, plan: DrawPlan, options: { runSeed: number | string; samples?: number }): SiteDrawValues {
  const central = plan.central.assumptions
  const sets = planEvaluations(plan)
  const E = sets.length
  const nT = site.tanks.length
  const values = new Float64Array(E * nT * M)
  const factors = Float64Array.from(sets, (d) => d.flashDensityFactor)
  if (nT === 0) return { evaluations: E, nTanks: 0, values, flashes: 0, factors }
  const ps = prepareSite(site, central)
  const wide = prepareSite(site, widenedAssumptions(central, sets))
  const samples = options.samples ?? DRAW_FLASHES_PER_SITE
  const fr = sampleFlashes(site, ps, wide, samples, options.runSeed)
  const F = fr.weight.length
  // Class geometry: ln h per class entry (the class's height), from the compiled site.
  const kc0 = couplingCoefficient(central)
  const classKindU50 = (a: AssumptionSet, c: number) => a.thresholds[componentClassKey(ps, c)]
  const lnH = Float64Array.from(ps.classLogCoef, (coef, c) => coef - Math.log(kc0) + Math.log(classKindU50(central, c).u50Kv))
  const lawPaths = LAW_PATHS[central.currentLaw]
  const lawDrawn = plan.entries.some((e) => lawPaths.includes(e.path))
  const baseLogDensity = lawDrawn ? logDensities(central, fr.lnI) : null
  const keys = evaluationKeys(plan, sets)
  // The shared flashes' weights re-weighted to each drawn law, once per distinct law.
  const lawWeights = new Map<number, Float64Array>()
  const weightsOf = (e: number): Float64Array => {
    if (!lawDrawn || keys.law[e] === keys.law[0]) return fr.weight
    const key = keys.law[e]!
    let w = lawWeights.get(key)
    if (!w) {
      const logF = logDensities(sets[e]!.assumptions, fr.lnI)
      w = new Float64Array(F)
      for (let f = 0; f < F; f++) w[f] = fr.weight[f]! * Math.exp(logF[f]! - baseLogDensity![f]!)
      lawWeights.set(key, w)
    }
    return w
  }
  const spreadCentral = spreadTable(site, central)
  const spreadDrawn = plan.entries.some((e) => e.path.startsWith('fireSpread.'))

  const logCoef = new Float64Array(ps.classLogCoef.length)
  const invSigma = new Float64Array(ps.classLogCoef.length)
  const pD = new Float64Array(nT), pS = new Float64Array(nT), loss = new Float64Array(nT)
  const q = new Float64Array(nT), escape = new Float64Array(nT)
  const touched = new Int32Array(nT)
  const { evStart, evTank, evClassX, classX } = fr
  const classStart = ps.classStart
  const classCount = ps.classCount
  // Per event (flash × tank): its sparking probability (1 for a direct strike). It depends only on
  // the coupling and the sparking levels and scatters, which many evaluations of Saltelli's design
  // share (A_B^g for a factor g that is not one of them has A's values): evaluations are grouped by
  // those values and the probabilities computed once per group.
  const pEvent = new Float64Array(evTank.length)
  // The sums over the shared flashes of an evaluation (direct, sparking, ignition, spread per tank)
  // depend on neither the flash-density factor nor the damage ratios (they scale the figures after):
  // one sum serves every evaluation with the same other values (A_B^g of those factors has A's).
  const sums = new Map<number, Float64Array>()
  const groups = new Map<number, number[]>()
  for (let e = 0; e < E; e++) {
    const g = groups.get(keys.spark[e]!)
    if (g) g.push(e)
    else groups.set(keys.spark[e]!, [e])
  }
  for (const members of groups.values()) {
    const first = sets[members[0]!]!.assumptions
    const kc = couplingCoefficient(first)
    for (let c = 0; c < logCoef.length; c++) {
      const th = classKindU50(first, c)
      logCoef[c] = lnH[c]! + Math.log(kc / th.u50Kv)
      invSigma[c] = th.sigma > 0 ? 1 / th.sigma : 1e12
    }
    for (let k = 0; k < evTank.length; k++) {
      const cx = evClassX[k]!
      if (cx < 0) { pEvent[k] = 1; continue }
      const t = evTank[k]!
      const c0 = classStart[t]!
      const c1 = classStart[t + 1]!
      let survive = 1
      for (let c = c0; c < c1; c++) {
        const z = (classX[cx + c - c0]! + logCoef[c]!) * invSigma[c]!
        if (z < Z_NEGLIGIBLE) continue
        if (z > 9) { survive = 0; break }
        const n = classCount[c]!
        survive *= n === 1 ? phi(-z) : Math.pow(phi(-z), n)
      }
      pEvent[k] = 1 - survive
    }
    for (const e of members) evaluate(e)
  }

  function evaluate(e: number): void {
    const a = sets[e]!.assumptions
    site.tanks.forEach((tank, t) => { loss[t] = expectedBurningTankLoss(tank, a).total })
    let acc = sums.get(keys.sum[e]!)
    if (!acc) {
      acc = flashSums(e)
      sums.set(keys.sum[e]!, acc)
    }
    const scale = site.flashDensity * sets[e]!.flashDensityFactor * 1e-6 / samples
    for (let t = 0; t < nT; t++) {
      const o = (e * nT + t) * M
      values[o] = scale * acc[t * 4]!
      values[o + 1] = scale * acc[t * 4 + 1]!
      values[o + 2] = scale * acc[t * 4 + 2]!
      values[o + 3] = scale * (acc[t * 4 + 2]! + acc[t * 4 + 3]!) * loss[t]!
    }
  }

  /** Per tank, the weighted sums over the shared flashes of direct strikes, sparking, ignition and fires by spread. */
  function flashSums(e: number): Float64Array {
    const a = sets[e]!.assumptions
    site.tanks.forEach((tank, t) => {
      pD[t] = ignitionGivenDirect(tank, a)
      pS[t] = hasInducedSparking(tank) ? ignitionGivenSpark(tank, a) : 0
    })
    const spread = spreadDrawn ? spreadTable(site, a) : spreadCentral
    // Importance re-weighting of the shared currents to the drawn law: w·f_k(ln I)/f_0(ln I).
    const w8 = weightsOf(e)
    const acc = new Float64Array(nT * 4)
    const spreadStart = spread.spreadStart, spreadTank = spread.spreadTank, spreadProbability = spread.spreadProbability
    const hasSpread = spreadTank.length > 0
    for (let f = 0; f < F; f++) {
      const w = w8[f]!
      let nTouched = 0
      let anyIgnition = false
      for (let k = evStart[f]!; k < evStart[f + 1]!; k++) {
        const t = evTank[k]!
        const pt = pEvent[k]!
        let qt: number
        if (evClassX[k]! < 0) { acc[t * 4]! += w; qt = pD[t]! }
        else { acc[t * 4 + 1]! += w * pt; qt = pt * pS[t]! }
        q[t] = qt
        acc[t * 4 + 2]! += w * qt
        if (qt > 0) anyIgnition = true
        touched[nTouched++] = t
      }
      // Fire spread (as spread-frequency.ts): j burns by spread with (1 − q_j)(1 − Π_i(1 − q_i·p_ij)).
      if (hasSpread && anyIgnition) {
        escape.fill(1)
        for (let i = 0; i < nTouched; i++) {
          const s = touched[i]!
          const qi = q[s]!
          if (qi === 0) continue
          for (let k = spreadStart[s]!; k < spreadStart[s + 1]!; k++) escape[spreadTank[k]!]! *= 1 - qi * spreadProbability[k]!
        }
        for (let j = 0; j < nT; j++) if (escape[j]! < 1) acc[j * 4 + 3]! += w * (1 - q[j]!) * (1 - escape[j]!)
      }
      for (let i = 0; i < nTouched; i++) q[touched[i]!] = 0
    }
    return acc
  }
  return { evaluations: E, nTanks: nT, values, flashes: F, factors }
}

/** Per evaluation of a plan, numbered keys of what its parts depend on (equal key, equal values). */
interface EvaluationKeys {
  /** The coupling and every class's sparking level and scatter: the events' sparking probabilities. */
  spark: Int32Array
  /** The current law: the shared flashes' weights. */
  law: Int32Array
  /** Everything but the flash-density factor and the damage ratios: the sums over the shared flashes. */
  sum: Int32Array
}

const planKeys = new WeakMap<DrawPlan, EvaluationKeys>()

/** Built once per plan (every site of a run shares it). */
function evaluationKeys(plan: DrawPlan, sets: readonly AssumptionDraw[]): EvaluationKeys {
  const known = planKeys.get(plan)
  if (known && known.spark.length === sets.length) return known
  const numbering = () => {
    const ids = new Map<string, number>()
    return (text: string) => {
      let id = ids.get(text)
      if (id === undefined) ids.set(text, id = ids.size)
      return id
    }
  }
  const spark = numbering(), law = numbering(), sum = numbering()
  const keys: EvaluationKeys = { spark: new Int32Array(sets.length), law: new Int32Array(sets.length), sum: new Int32Array(sets.length) }
  sets.forEach((d, e) => {
    const a = d.assumptions
    keys.spark[e] = spark(`${couplingCoefficient(a)}|${JSON.stringify(a.thresholds)}`)
    keys.law[e] = law(JSON.stringify([lawSpec(a), a.currentMinKa, a.currentMaxKa]))
    keys.sum[e] = sum(JSON.stringify({ ...a, damageRatio: null }))
  })
  planKeys.set(plan, keys)
  return keys
}

function componentClassKey(ps: PreparedSite, c: number): keyof AssumptionSet['thresholds'] {
  return (['sharp_device', 'grounded_pipe', 'rounded_conductor', 'carbon_fibre'] as const)[ps.classKind[c]!]!
}

/** Type-7 quantile (Hyndman & Fan 1996; R's and NumPy's default) of unsorted values. */
export function quantile(values: ArrayLike<number>, prob: number): number {
  const sorted = Float64Array.from(values).sort()
  const h = (sorted.length - 1) * prob
  const lo = Math.floor(h)
  const hi = Math.min(sorted.length - 1, lo + 1)
  return sorted[lo]! + (h - lo) * (sorted[hi]! - sorted[lo]!)
}

export function bandOf(values: ArrayLike<number>): DrawBand {
  return { p05: quantile(values, 0.05), p50: quantile(values, 0.5), p95: quantile(values, 0.95) }
}

export type DrawBands = Record<DrawMetric, DrawBand>

/** Per evaluation (planEvaluations order), the site's figure summed over its tanks after the ratio adjustment. */
export interface SiteDrawSeries { direct: Float64Array; sparking: Float64Array; ignition: Float64Array; expectedAnnualLoss: Float64Array }

export interface SiteDrawSummary {
  tanks: DrawBands[]
  site: DrawBands
  series: SiteDrawSeries
  sensitivity: SensitivityResult[]
}

/**
 * Central figure × X_k / X_0 per tank and evaluation: the band is anchored on the run's central
 * figure (its own estimator) and moves with the common-random-number ratio. A figure the shared
 * flashes never saw at the central assumptions (X_0 = 0: a rare direct strike on a shadowed tank)
 * moves with the flash-density factor only, the one change known exactly without them.
 */
export function adjustToCentral(v: SiteDrawValues, centralRates: readonly Record<DrawMetric, number>[]): SiteDrawSeries {
  const { evaluations: E, nTanks: nT, values } = v
  const series: SiteDrawSeries = { direct: new Float64Array(E), sparking: new Float64Array(E), ignition: new Float64Array(E), expectedAnnualLoss: new Float64Array(E) }
  for (let t = 0; t < nT; t++) {
    DRAW_METRICS.forEach((m, mi) => {
      const x0 = values[t * M + mi]!
      const c = centralRates[t]![m]
      for (let e = 0; e < E; e++) {
        const x = values[(e * nT + t) * M + mi]!
        series[m][e]! += x0 > 0 ? c * x / x0 : c * v.factors[e]!
      }
    })
  }
  return series
}

/** The band draws (rows of A) of a series of evaluations. */
export function drawsOf(series: Float64Array, K: number): Float64Array {
  return series.subarray(1, 1 + K)
}

/** Sensitivity indices of one metric from its series over the plan's evaluations. */
export function sensitivityOf(series: Float64Array, plan: Pick<DrawPlan, 'draws' | 'baseSamples' | 'factors'>, metric: SensitivityResult['metric'], seed: string | number): SensitivityResult {
  const N = plan.baseSamples
  const at = designOffsets(plan)
  const fA = series.subarray(at.a, at.a + N)
  const fB = series.subarray(at.b, at.b + N)
  const fAB = at.ab.map((o) => series.subarray(o, o + N))
  const s = sobolIndices({ fA, fB, fAB }, { seed: `${seed}|${metric}` })
  return {
    metric, baseSamples: N,
    indices: plan.factors.map((f, g) => ({ path: f.path, label: f.label, unit: f.unit, ...(f.members ? { members: f.members } : {}), firstOrder: s.firstOrder[g]!, totalEffect: s.totalEffect[g]! }))
      .sort((x, y) => y.totalEffect.estimate - x.totalEffect.estimate),
  }
}

/** Bands per tank and for the site, the site's series (for the portfolio) and its sensitivity indices. */
export function summariseSiteDraws(v: SiteDrawValues, centralRates: readonly Record<DrawMetric, number>[], plan: DrawPlan, seed: string | number): SiteDrawSummary {
  const K = plan.draws
  const nT = v.nTanks
  const tanks = Array.from({ length: nT }, (_, t) => {
    const one = adjustToCentral({ ...v, nTanks: 1, values: tankValues(v, t) }, [centralRates[t]!])
    return Object.fromEntries(DRAW_METRICS.map((m) => [m, bandOf(drawsOf(one[m], K))])) as DrawBands
  })
  const series = adjustToCentral(v, centralRates)
  return {
    tanks,
    site: Object.fromEntries(DRAW_METRICS.map((m) => [m, bandOf(drawsOf(series[m], K))])) as DrawBands,
    series,
    sensitivity: [sensitivityOf(series.ignition, plan, 'expectedFires', seed), sensitivityOf(series.expectedAnnualLoss, plan, 'aal', seed)],
  }
}

function tankValues(v: SiteDrawValues, t: number): Float64Array {
  const out = new Float64Array(v.evaluations * M)
  for (let e = 0; e < v.evaluations; e++) for (let m = 0; m < M; m++) out[e * M + m] = v.values[(e * v.nTanks + t) * M + m]!
  return out
}
