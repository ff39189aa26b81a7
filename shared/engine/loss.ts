// Loss given ignition (MODEL.md §4): per loss component a damage ratio on [0, 1] times the
// component's value, property damage (replacement + contents + clean-up) apart from business
// interruption, and fire spreading from a burning tank to its neighbours in a battery.
// Framework-free like the rest of the engine.
import jStat from 'jstat'
import type { Estimate, SiteInput, TankInput } from './types'
import type { AssumptionSet } from './assumptions'
import { normalEstimate } from './statistics'

export type LossComponent = 'replacement' | 'contents' | 'cleanup' | 'interruption'
export const LOSS_COMPONENTS: readonly LossComponent[] = ['replacement', 'contents', 'cleanup', 'interruption']
/** Property damage components; the remaining one (interruption) is business interruption. */
export const PROPERTY_COMPONENTS: readonly LossComponent[] = ['replacement', 'contents', 'cleanup']

/** A damage ratio's mean and standard deviation, both on [0, 1]. */
export interface DamageRatio { mean: number; sd: number }

export interface FireSpread {
  /** 'exponential': p(d) = p0·exp(−d/L) for shell-to-shell distance d ≤ dmax, else 0; 'off': no spread. */
  model: 'exponential' | 'off'
  probabilityAtContact: number
  decayLengthM: number
  maxDistanceM: number
}

/** Money of one burning tank (or an expectation of it), by component and as PD / BI / total. */
export interface TankLoss {
  replacement: number; contents: number; cleanup: number; interruption: number
  propertyDamage: number; businessInterruption: number; total: number
}

/** The money value of each loss component of a tank (its value at risk, component by component). */
export function componentValues(tank: Pick<TankInput, 'replacementValue' | 'contentsValue' | 'cleanupCost' | 'interruptionCost'>): Record<LossComponent, number> {
  return { replacement: tank.replacementValue, contents: tank.contentsValue, cleanup: tank.cleanupCost, interruption: tank.interruptionCost }
}

/**
 * Beta shape parameters from a mean m and standard deviation s (method of moments):
 * k = m(1 − m)/s² − 1, α = m·k, β = (1 − m)·k. null when the ratio is a constant (s = 0, m = 0 or m = 1).
 */
export function betaShape(d: DamageRatio): { alpha: number; beta: number } | null {
  if (d.sd === 0 || d.mean <= 0 || d.mean >= 1) return null
  const k = (d.mean * (1 - d.mean)) / (d.sd * d.sd) - 1
  return { alpha: d.mean * k, beta: (1 - d.mean) * k }
}

/** Largest standard deviation a ratio on [0, 1] with this mean can have (strictly below √(m(1−m))). */
export function maxDamageRatioSd(mean: number): number {
  return Math.sqrt(Math.max(0, mean * (1 - mean)))
}

/** The damage ratio at probability level u ∈ (0, 1), exactly: the beta quantile (jstat), or the mean when constant. */
export function exactDamageRatioQuantile(d: DamageRatio, u: number): number {
  const shape = betaShape(d)
  if (shape === null) return d.mean
  const x = jStat.beta.inv(u, shape.alpha, shape.beta)
  return Math.min(1, Math.max(0, x))
}

// jstat's beta quantile costs about 0.1 ms (Newton steps on a continued fraction), too slow for
// millions of fires. The quantile is tabulated once per distribution at QUANTILE_NODES + 1 equally
// spaced levels and interpolated linearly; the outer intervals, where the quantile bends sharply,
// are computed exactly. Interpolation error is below 1e-4 (a ratio, i.e. 0.01 % of the value) for the distributions the
// schema admits (checked against jstat in the tests).
const QUANTILE_NODES = 1024
const quantileTables = new Map<string, Float64Array>()
/** The table of each damage-ratio object seen, with the (mean, sd) it was built for: no key text per fire. */
const tablesByRatio = new WeakMap<DamageRatio, { mean: number; sd: number; table: Float64Array }>()

function quantileTable(d: DamageRatio): Float64Array {
  const known = tablesByRatio.get(d)
  if (known && known.mean === d.mean && known.sd === d.sd) return known.table
  const table = quantileTableByValue(d)
  tablesByRatio.set(d, { mean: d.mean, sd: d.sd, table })
  return table
}

function quantileTableByValue(d: DamageRatio): Float64Array {
  const key = `${d.mean}|${d.sd}`
  let table = quantileTables.get(key)
  if (!table) {
    table = new Float64Array(QUANTILE_NODES + 1)
    table[0] = 0
    table[QUANTILE_NODES] = 1
    for (let i = 1; i < QUANTILE_NODES; i++) table[i] = exactDamageRatioQuantile(d, i / QUANTILE_NODES)
    if (quantileTables.size > 64) quantileTables.clear()
    quantileTables.set(key, table)
  }
  return table
}

/** The damage ratio at probability level u ∈ (0, 1): the beta quantile (tabulated), or the mean when constant. */
export function damageRatioQuantile(d: DamageRatio, u: number): number {
  // betaShape(d) === null, without building its object (this runs for every simulated fire).
  if (d.sd === 0 || d.mean <= 0 || d.mean >= 1) return d.mean
  const x = u * QUANTILE_NODES
  if (x < 1 || x >= QUANTILE_NODES - 1) return exactDamageRatioQuantile(d, u)
  const table = quantileTable(d)
  const i = Math.floor(x)
  const f = x - i
  return table[i]! + f * (table[i + 1]! - table[i]!)
}

function tankLoss(parts: Record<LossComponent, number>): TankLoss {
  const propertyDamage = parts.replacement + parts.contents + parts.cleanup
  const businessInterruption = parts.interruption
  return { ...parts, propertyDamage, businessInterruption, total: propertyDamage + businessInterruption }
}

/**
 * One burning tank's loss. One uniform u drives every component through its own quantile
 * (comonotone damage: a fire severe for the shell is severe for its contents and clean-up too),
 * so each component stays within its value and the tank within its value at risk.
 */
export function burningTankLoss(tank: Pick<TankInput, 'replacementValue' | 'contentsValue' | 'cleanupCost' | 'interruptionCost'>, a: Pick<AssumptionSet, 'damageRatio'>, u: number): TankLoss {
  // Written out per component (the same products and sums as componentValues × damageRatioQuantile
  // through tankLoss): one object per fire instead of four.
  const dr = a.damageRatio
  const replacement = tank.replacementValue * damageRatioQuantile(dr.replacement, u)
  const contents = tank.contentsValue * damageRatioQuantile(dr.contents, u)
  const cleanup = tank.cleanupCost * damageRatioQuantile(dr.cleanup, u)
  const interruption = tank.interruptionCost * damageRatioQuantile(dr.interruption, u)
  const propertyDamage = replacement + contents + cleanup
  return { replacement, contents, cleanup, interruption, propertyDamage, businessInterruption: interruption, total: propertyDamage + interruption }
}

/**
 * Expected loss of one burning tank (its own fire, no spread), per component and as PD / BI:
 * value × mean damage ratio. The storm report and the frequency mode use this figure.
 */
export function expectedBurningTankLoss(tank: Pick<TankInput, 'replacementValue' | 'contentsValue' | 'cleanupCost' | 'interruptionCost'>, a: Pick<AssumptionSet, 'damageRatio'>): TankLoss {
  const values = componentValues(tank)
  const parts = {} as Record<LossComponent, number>
  for (const c of LOSS_COMPONENTS) parts[c] = values[c] * a.damageRatio[c].mean
  return tankLoss(parts)
}

/** Can fire reach this tank's contents? Only a flammable vapour space over something that burns. */
export function canBurn(tank: Pick<TankInput, 'flammableVapourSpace' | 'contents'>): boolean {
  return tank.flammableVapourSpace && tank.contents !== 'fresh_water'
}

/** Shell-to-shell distance of two vertical cylinders (m), 0 when they touch or overlap. */
export function shellDistanceM(a: Pick<TankInput, 'xM' | 'yM' | 'diameterM'>, b: Pick<TankInput, 'xM' | 'yM' | 'diameterM'>): number {
  return Math.max(0, Math.hypot(a.xM - b.xM, a.yM - b.yM) - a.diameterM / 2 - b.diameterM / 2)
}

/** Probability that a burning tank ignites a neighbour at shell-to-shell distance d (m). */
export function spreadProbability(distanceM: number, s: FireSpread): number {
  if (s.model === 'off' || distanceM > s.maxDistanceM) return 0
  return s.probabilityAtContact * Math.exp(-distanceM / s.decayLengthM)
}

export interface SpreadNeighbour { tankIndex: number; tankId: string; tag: string; distanceM: number; probability: number }

/** Neighbours a fire at each tank can reach, most likely first (empty lists when spread is off). */
export function spreadNeighbours(site: Pick<SiteInput, 'tanks'>, a: Pick<AssumptionSet, 'fireSpread'>): SpreadNeighbour[][] {
  const tanks = site.tanks
  return tanks.map((from, i) => {
    const out: SpreadNeighbour[] = []
    if (a.fireSpread.model === 'off') return out
    for (let j = 0; j < tanks.length; j++) {
      if (j === i || !canBurn(tanks[j]!)) continue
      const distanceM = shellDistanceM(from, tanks[j]!)
      const probability = spreadProbability(distanceM, a.fireSpread)
      if (probability > 0) out.push({ tankIndex: j, tankId: tanks[j]!.id, tag: tanks[j]!.tag, distanceM, probability })
    }
    return out.sort((x, y) => y.probability - x.probability || x.tankIndex - y.tankIndex)
  })
}

/** Spread neighbours packed for the hot loops: tank i reaches spreadTank[spreadStart[i] … spreadStart[i+1]). */
export interface SpreadTable { spreadStart: Int32Array; spreadTank: Int32Array; spreadProbability: Float64Array }

export function spreadTable(site: Pick<SiteInput, 'tanks'>, a: Pick<AssumptionSet, 'fireSpread'>): SpreadTable {
  const lists = spreadNeighbours(site, a)
  const total = lists.reduce((n, l) => n + l.length, 0)
  const table: SpreadTable = { spreadStart: new Int32Array(lists.length + 1), spreadTank: new Int32Array(total), spreadProbability: new Float64Array(total) }
  let k = 0
  lists.forEach((list, i) => {
    table.spreadStart[i] = k
    // Index order, so the year mode draws neighbours in a fixed order.
    for (const n of [...list].sort((x, y) => x.tankIndex - y.tankIndex)) { table.spreadTank[k] = n.tankIndex; table.spreadProbability[k++] = n.probability }
  })
  table.spreadStart[lists.length] = k
  return table
}

/**
 * Expected loss of a fire that starts at tank i, spread included (one generation: a tank set
 * burning by spread does not spread further): E_i + Σ_j p_ij·E_j. Used for loss reductions.
 */
export function expectedFireLoss(i: number, expected: readonly TankLoss[], spread: SpreadTable): number {
  let total = expected[i]!.total
  for (let k = spread.spreadStart[i]!; k < spread.spreadStart[i + 1]!; k++) total += spread.spreadProbability[k]! * expected[spread.spreadTank[k]!]!.total
  return total
}

export interface FrequencyLosses {
  /** Per tank: the expected annual loss it suffers (its own fires and fires spreading to it). */
  tanks: { total: Estimate; propertyDamage: Estimate; businessInterruption: Estimate }[]
  site: { total: Estimate; propertyDamage: Estimate; businessInterruption: Estimate }
}

/** Mean annual spread loss per tank (PD, BI) with the variances of the means (spread-frequency.ts). */
export interface SpreadLossParts {
  propertyDamage: ArrayLike<number>; businessInterruption: ArrayLike<number>
  varPropertyDamage: ArrayLike<number>; varBusinessInterruption: ArrayLike<number>
}

/**
 * Frequency mode's expected annual losses: tank j suffers f_j·E_j from its own fires plus its
 * expected spread loss. Standard errors treat the tanks' ignition estimates and the spread
 * estimate as independent (each has its own stream); PD and BI of one tank come from the same
 * draws, so the total's variance adds their standard errors (perfect correlation, conservative).
 */
export function frequencyLosses(ignition: readonly Estimate[], expected: readonly TankLoss[], spread: SpreadLossParts): FrequencyLosses {
  const tanks = ignition.map((f, j) => {
    const e = expected[j]!
    const pdRate = f.rate * e.propertyDamage + spread.propertyDamage[j]!
    const biRate = f.rate * e.businessInterruption + spread.businessInterruption[j]!
    const pdVar = (f.se * e.propertyDamage) ** 2 + spread.varPropertyDamage[j]!
    const biVar = (f.se * e.businessInterruption) ** 2 + spread.varBusinessInterruption[j]!
    const totalSe = Math.sqrt((f.se * e.total) ** 2 + (Math.sqrt(spread.varPropertyDamage[j]!) + Math.sqrt(spread.varBusinessInterruption[j]!)) ** 2)
    return {
      total: normalEstimate(pdRate + biRate, totalSe),
      propertyDamage: normalEstimate(pdRate, Math.sqrt(pdVar)),
      businessInterruption: normalEstimate(biRate, Math.sqrt(biVar)),
    }
  })
  const add = (pick: (t: typeof tanks[number]) => Estimate) => {
    let rate = 0
    let variance = 0
    for (const t of tanks) { rate += pick(t).rate; variance += pick(t).se ** 2 }
    return normalEstimate(rate, Math.sqrt(variance))
  }
  return { tanks, site: { total: add(t => t.total), propertyDamage: add(t => t.propertyDamage), businessInterruption: add(t => t.businessInterruption) } }
}
