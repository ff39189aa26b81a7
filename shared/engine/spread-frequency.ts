// Frequency mode's expected loss from fire spread (MODEL.md §4), by the rule the simulated years
// follow: given a flash, tanks ignite independently with q_t (event probability × ignition given a
// direct strike or a spark), and a tank the flash did not light burns by spread with
// 1 − Π_i (1 − q_i·p_ij). Its expectation over flashes is estimated with the year mode's thinning
// envelope: E[annual spread loss] = (candidate rate) × E_candidate[h(flash) / bound], where h is
// the conditional expected spread loss of the flash — no coin flips, and flashes that light
// several tanks at once (common in a close battery) are counted as the simulated years count them.
import type { PreparedSite } from './kernel'
import type { Candidate } from './envelope'
import { attachFlash, siteEventProbabilities, strikeRadius } from './kernel'
import { cellBoundOf, drawCandidate } from './envelope'
import type { SitePreparation } from './prepared'
import { preparationOf } from './prepared'
import { createStream } from './random'

/** Per tank: mean annual spread loss (PD, BI) and the variances of those means. */
export interface SpreadLossEstimate {
  propertyDamage: Float64Array
  businessInterruption: Float64Array
  varPropertyDamage: Float64Array
  varBusinessInterruption: Float64Array
}

/** Most candidate flashes drawn for the spread estimate of one site (all of them when no stopping rule is given). */
export const SPREAD_SAMPLES = 40_000
/** Candidates per batch of the stopping rule; the first look comes after one batch. */
export const SPREAD_BATCH = 4_000

/**
 * Stopping rule: stop after a batch once, for every tank, the standard error of its spread loss is
 * at most `targetRse` of its whole expected annual loss (`ownLossPerYear[j]`, its own fires, plus
 * the spread estimate): the spread part then adds less than the run's target to the tank's error.
 */
export interface SpreadStopping { targetRse: number; ownLossPerYear: ArrayLike<number> }

/**
 * `prepared`: the task's compiled site of `ps`, whose envelope is then built once for every figure.
 * `stopping`: draw in batches of SPREAD_BATCH up to `samples` and stop by that rule; without it, all `samples`.
 */
export function estimateSpreadLosses(ps: PreparedSite, runSeed: number | string, samples = SPREAD_SAMPLES, prepared: SitePreparation = preparationOf(ps), stopping?: SpreadStopping): SpreadLossEstimate {
  const n = ps.nTanks
  const out: SpreadLossEstimate = {
    propertyDamage: new Float64Array(n), businessInterruption: new Float64Array(n),
    varPropertyDamage: new Float64Array(n), varBusinessInterruption: new Float64Array(n),
  }
  if (ps.spread.spreadTank.length === 0 || n < 2) return out
  const env = prepared.envelope()
  if (!(env.totalRate > 0)) return out
  const rand = createStream(runSeed, ps.siteId, 'frequency/spread')
  const flash: Candidate = { x: 0, y: 0, currentKa: 0, lnI: 0, cell: 0 }
  const p = new Float64Array(n)
  const q = new Float64Array(n)
  const escape = new Float64Array(n)
  const sum = new Float64Array(n)
  const sum2 = new Float64Array(n)
  let drawn = 0
  for (let s = 0; s < samples; s++) {
    if (stopping && s > 0 && s % SPREAD_BATCH === 0 && spreadSettled(ps, env.totalRate, sum, sum2, s, stopping)) break
    drawn = s + 1
    drawCandidate(ps, env, rand, flash)
    const attached = attachFlash(ps, flash.x, flash.y, strikeRadius(ps, flash.lnI))
    const none = siteEventProbabilities(ps, flash.currentKa, flash.lnI, attached, flash.x, flash.y, p)
    if (none === 1) continue
    const weight = 1 / cellBoundOf(env, flash.cell)
    for (let t = 0; t < n; t++) { q[t] = p[t]! * (attached === t ? ps.pIgnDirect[t]! : ps.pIgnSpark[t]!); escape[t] = 1 }
    for (let i = 0; i < n; i++) {
      if (q[i] === 0) continue
      for (let k = ps.spread.spreadStart[i]!; k < ps.spread.spreadStart[i + 1]!; k++) escape[ps.spread.spreadTank[k]!]! *= 1 - q[i]! * ps.spread.spreadProbability[k]!
    }
    for (let j = 0; j < n; j++) {
      if (escape[j] === 1) continue
      // Conditional probability that j burns by spread (not lit by the flash itself), per unit of its expected loss.
      const h = (1 - q[j]!) * (1 - escape[j]!) * weight
      sum[j]! += h
      sum2[j]! += h * h
    }
  }
  const rate = env.totalRate
  if (drawn > 0) samples = drawn
  for (let j = 0; j < n; j++) {
    const mean = sum[j]! / samples
    const variance = samples > 1 ? Math.max(0, (sum2[j]! - samples * mean * mean) / (samples - 1)) / samples : 0
    const pd = ps.expectedLoss[j]!.propertyDamage
    const bi = ps.expectedLoss[j]!.businessInterruption
    out.propertyDamage[j] = rate * mean * pd
    out.businessInterruption[j] = rate * mean * bi
    out.varPropertyDamage[j] = (rate * pd) ** 2 * variance
    out.varBusinessInterruption[j] = (rate * bi) ** 2 * variance
  }
  return out
}

/** The stopping rule after `samples` candidates (see SpreadStopping). */
function spreadSettled(ps: PreparedSite, rate: number, sum: Float64Array, sum2: Float64Array, samples: number, stopping: SpreadStopping): boolean {
  for (let j = 0; j < ps.nTanks; j++) {
    if (sum[j] === 0) continue
    const loss = ps.expectedLoss[j]!.propertyDamage + ps.expectedLoss[j]!.businessInterruption
    const mean = sum[j]! / samples
    const variance = Math.max(0, (sum2[j]! - samples * mean * mean) / (samples - 1)) / samples
    const se = rate * loss * Math.sqrt(variance)
    if (se > stopping.targetRse * (stopping.ownLossPerYear[j]! + rate * loss * mean)) return false
  }
  return true
}
