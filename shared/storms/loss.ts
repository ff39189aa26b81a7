// After the storm, in money (methodology §11): one site's loss from one storm window as one
// occurrence. The tanks a window's flashes ignite are taken as independent, each with its computed
// P(fire); a fire spreads from the tanks the flashes set alight to their neighbours exactly as in
// year mode (one generation, p_ij of loss.ts); every burning tank's loss is the runs' own severity
// model (burningTankLoss: one uniform per tank, beta damage ratio per component, PD apart from BI).
// The insured loss is E[ terms(Σ PD, Σ BI) ] × share over that distribution — never the terms on
// the mean loss, which understates a deductible (E[(X − d)+] ≥ (E[X] − d)+).
//
// How: the ground-up expectation is linear, so it is exact in closed form. The insured expectation
// is computed exactly (up to quadrature) when at most STORM_EXACT_MAX_TANKS tanks can burn: every
// burning set B is enumerated with its probability, and E[terms | B] is a tensor-product midpoint
// rule over the |B| uniforms. With more tanks it is a seeded Monte Carlo conditioned on at least one
// flash ignition, with its standard error. Framework-free: the server, the tests and the benchmark
// run the same code.
import type { AssumptionSet } from '../engine/assumptions'
import type { PreparedSite } from '../engine/kernel'
import { componentValues, damageRatioQuantile, expectedBurningTankLoss, LOSS_COMPONENTS, PROPERTY_COMPONENTS, type DamageRatio, type LossComponent, type SpreadTable } from '../engine/loss'
import { createStream, type UniformStream } from '../engine/random'
import { drawOutcome, spreadFires } from '../engine/years'
import { occurrenceNetTotal, type SiteTerms } from '../insurance/terms'

/** What one site brings to a storm's loss: stored with the window, so terms can be applied when read. */
export interface StormSiteLossModel {
  version: 1
  /** Tanks that can burn: ignited by a flash (P(fire) > 0) or reached by spread from such a tank. */
  tanks: { tankId: string, ignition: number, values: Record<LossComponent, number> }[]
  /** [from, to, p]: a fire the flashes started at `from` spreads to `to` with probability p (indices into tanks). */
  spread: [number, number, number][]
  damageRatio: Record<LossComponent, DamageRatio>
  /** Σ over every tank of the site of every loss component's value: what is at risk (money). */
  valueAtRisk: number
}

export type StormLossMethod = 'exact' | 'monte-carlo' | 'closed-form'

export interface StormSiteLoss {
  /** P(at least one tank of the site burns). */
  probabilityOfFire: number
  /** Expected number of tanks burning, spread included. */
  expectedBurningTanks: number
  groundUp: { total: number, propertyDamage: number, businessInterruption: number }
  /** Per tank of the model: P(it burns, spread included) and its expected loss given it burns. */
  tanks: { tankId: string, burning: number, expectedLossIfBurning: number }[]
  /** null when the reader has no terms on the site. */
  insured: { mean: number, se: number, method: StormLossMethod, samples: number } | null
  /** The most the occurrence can cost the insurer: min(value at risk, occurrence limit) × share. */
  insuredAtRisk: number | null
}

/** Enumerate exactly up to this many tanks that can burn (2⁴ burning sets); Monte Carlo beyond. */
export const STORM_EXACT_MAX_TANKS = 4
/** Midpoint nodes per uniform for a burning set of d tanks (d = 1 … 4): about 6.6e4 points per set at most. */
const EXACT_NODES = [0, 4096, 256, 40, 16]
/** Monte Carlo: each burning tank's damage is one of this many equally likely midpoint levels (stratified inverse transform). */
const MC_LEVELS = 4096
/** Monte Carlo draws (each conditioned on at least one flash ignition). */
export const STORM_MC_SAMPLES = 40_000

/** Builds a site's loss model from its prepared site and each tank's P(fire) (indices as the prepared site's tanks). */
export function stormSiteLossModel(ps: PreparedSite, ignition: ArrayLike<number>, negligible = 1e-9): StormSiteLossModel {
  const n = ps.nTanks
  const live = new Uint8Array(n)
  for (let t = 0; t < n; t++) {
    if (!(ignition[t]! >= negligible)) continue
    live[t] = 1
    for (let k = ps.spread.spreadStart[t]!; k < ps.spread.spreadStart[t + 1]!; k++) live[ps.spread.spreadTank[k]!] = 1
  }
  const index = new Int32Array(n).fill(-1)
  const tanks: StormSiteLossModel['tanks'] = []
  for (let t = 0; t < n; t++) {
    if (!live[t]) continue
    index[t] = tanks.length
    tanks.push({ tankId: ps.tanks[t]!.id, ignition: ignition[t]! >= negligible ? ignition[t]! : 0, values: componentValues(ps.tanks[t]!) })
  }
  const spread: [number, number, number][] = []
  for (let t = 0; t < n; t++) {
    if (index[t]! < 0 || !(ignition[t]! >= negligible)) continue
    for (let k = ps.spread.spreadStart[t]!; k < ps.spread.spreadStart[t + 1]!; k++) spread.push([index[t]!, index[ps.spread.spreadTank[k]!]!, ps.spread.spreadProbability[k]!])
  }
  let valueAtRisk = 0
  for (const tank of ps.tanks) for (const v of Object.values(componentValues(tank))) valueAtRisk += v
  return { version: 1, tanks, spread, damageRatio: ps.damageRatio, valueAtRisk }
}

const asTank = (values: Record<LossComponent, number>) =>
  ({ replacementValue: values.replacement, contentsValue: values.contents, cleanupCost: values.cleanup, interruptionCost: values.interruption })

function spreadTableOf(model: StormSiteLossModel): SpreadTable {
  const n = model.tanks.length
  const sorted = [...model.spread].sort((a, b) => a[0] - b[0] || a[1] - b[1])
  const table: SpreadTable = { spreadStart: new Int32Array(n + 1), spreadTank: new Int32Array(sorted.length), spreadProbability: new Float64Array(sorted.length) }
  let k = 0
  for (let i = 0; i < n; i++) {
    table.spreadStart[i] = k
    while (k < sorted.length && sorted[k]![0] === i) { table.spreadTank[k] = sorted[k]![1]; table.spreadProbability[k] = sorted[k]![2]; k++ }
  }
  table.spreadStart[n] = k
  return table
}

/** Terms that leave the loss as it is, but for the share: the insured expectation is then linear. */
function linearTerms(terms: SiteTerms): boolean {
  return terms.occurrenceDeductible === 0 && terms.interruptionDeductible === 0 && terms.occurrenceLimit === null
}

/**
 * A site's expected ground-up and insured loss from one storm window, the window one occurrence
 * per site. `seed` makes the Monte Carlo reproducible (the window and site ids).
 */
export function stormSiteLoss(model: StormSiteLossModel, terms: SiteTerms | null, seed: { window: string, site: string }, samples = STORM_MC_SAMPLES): StormSiteLoss {
  const n = model.tanks.length
  const a: Pick<AssumptionSet, 'damageRatio'> = { damageRatio: model.damageRatio }
  const q = model.tanks.map(t => t.ignition)
  // P(j burns) = 1 − (1 − q_j)·Π_{i≠j}(1 − q_i·p_ij): independent ignitions, one generation of spread.
  const escape = q.map(qj => 1 - qj)
  for (const [i, j, p] of model.spread) escape[j]! *= 1 - q[i]! * p
  const expected = model.tanks.map(t => expectedBurningTankLoss(asTank(t.values), a))
  const groundUp = { total: 0, propertyDamage: 0, businessInterruption: 0 }
  let expectedBurningTanks = 0
  const tanks = model.tanks.map((t, j) => {
    const burning = 1 - escape[j]!
    expectedBurningTanks += burning
    groundUp.propertyDamage += burning * expected[j]!.propertyDamage
    groundUp.businessInterruption += burning * expected[j]!.businessInterruption
    return { tankId: t.tankId, burning, expectedLossIfBurning: expected[j]!.total }
  })
  groundUp.total = groundUp.propertyDamage + groundUp.businessInterruption
  let noFire = 1
  for (const qi of q) noFire *= 1 - qi
  const insuredAtRisk = terms ? Math.min(model.valueAtRisk, terms.occurrenceLimit ?? Infinity) * terms.share : null
  const out: StormSiteLoss = { probabilityOfFire: 1 - noFire, expectedBurningTanks, groundUp, tanks, insured: null, insuredAtRisk }
  if (!terms) return out
  const capped = (x: number) => Math.min(x, insuredAtRisk!)
  if (linearTerms(terms)) out.insured = { mean: capped(groundUp.total * terms.share), se: 0, method: 'closed-form', samples: 0 }
  else if (n <= STORM_EXACT_MAX_TANKS) out.insured = { mean: capped(exactInsured(model, terms) * terms.share), se: 0, method: 'exact', samples: 0 }
  else {
    const mc = monteCarloInsured(model, terms, createStream(seed.window, seed.site, 'storm/insured'), samples)
    out.insured = { mean: capped(mc.mean * terms.share), se: mc.se * terms.share, method: 'monte-carlo', samples }
  }
  return out
}

/** Probability of each burning set (bit mask over the model's tanks): flash ignitions, then spread. */
export function burningSetProbabilities(model: Pick<StormSiteLossModel, 'tanks' | 'spread'>): Float64Array {
  const n = model.tanks.length
  const q = model.tanks.map(t => t.ignition)
  const out = new Float64Array(1 << n)
  for (let s = 0; s < 1 << n; s++) {
    let ps = 1
    for (let i = 0; i < n; i++) ps *= s & (1 << i) ? q[i]! : 1 - q[i]!
    if (ps === 0) continue
    // Given the flash-ignited set s, tank j ∉ s burns by spread with 1 − Π_{i∈s}(1 − p_ij), independently.
    const reach = new Float64Array(n).fill(1)
    for (const [i, j, p] of model.spread) if (s & (1 << i) && !(s & (1 << j))) reach[j]! *= 1 - p
    const open: number[] = []
    for (let j = 0; j < n; j++) if (!(s & (1 << j)) && reach[j]! < 1) open.push(j)
    for (let m = 0; m < 1 << open.length; m++) {
      let pm = ps
      let b = s
      open.forEach((j, k) => {
        if (m & (1 << k)) { pm *= 1 - reach[j]!; b |= 1 << j } else pm *= reach[j]!
      })
      out[b]! += pm
    }
  }
  return out
}

/** Damage-ratio quantiles at the midpoint levels, per distribution and node count (read only once made). */
const quantileLevels = new Map<string, Float64Array>()

export interface LevelTable { pd: Float64Array, bi: Float64Array }

/**
 * Every tank's PD and BI at the midpoint levels u_k = (k + ½)/nodes: burningTankLoss's sum
 * Σ value_c × damageRatioQuantile(ratio_c, u), with each component's quantiles computed once for
 * all tanks (the ratios are the site's, the same for every tank).
 */
export function levelTables(model: Pick<StormSiteLossModel, 'tanks' | 'damageRatio'>, nodes: number): LevelTable[] {
  const quantiles = {} as Record<LossComponent, Float64Array>
  for (const c of LOSS_COMPONENTS) {
    const ratio = model.damageRatio[c]
    const key = `${ratio.mean}|${ratio.sd}|${nodes}`
    let q = quantileLevels.get(key)
    if (!q) {
      q = new Float64Array(nodes)
      for (let k = 0; k < nodes; k++) q[k] = damageRatioQuantile(ratio, (k + 0.5) / nodes)
      if (quantileLevels.size > 64) quantileLevels.clear()
      quantileLevels.set(key, q)
    }
    quantiles[c] = q
  }
  return model.tanks.map(({ values }) => {
    const pd = new Float64Array(nodes), bi = new Float64Array(nodes)
    for (let k = 0; k < nodes; k++) {
      for (const c of PROPERTY_COMPONENTS) pd[k]! += values[c] * quantiles[c][k]!
      bi[k] = values.interruption * quantiles.interruption[k]!
    }
    return { pd, bi }
  })
}

/** E[terms(Σ PD, Σ BI)] (before the share) by enumeration of burning sets and midpoint quadrature over each tank's uniform. */
function exactInsured(model: StormSiteLossModel, terms: SiteTerms): number {
  const n = model.tanks.length
  const sets = burningSetProbabilities(model)
  // Per set size d: each tank's PD and BI at the d-node midpoints u_k = (k + ½)/n_d.
  const tables = new Map<number, LevelTable[]>()
  const tableFor = (d: number) => {
    let t = tables.get(d)
    if (!t) {
      t = levelTables(model, EXACT_NODES[d]!)
      tables.set(d, t)
    }
    return t
  }
  let total = 0
  for (let b = 1; b < sets.length; b++) {
    const pb = sets[b]!
    if (pb === 0) continue
    const members: number[] = []
    for (let j = 0; j < n; j++) if (b & (1 << j)) members.push(j)
    const d = members.length
    const nodes = EXACT_NODES[d]!
    const table = tableFor(d)
    // The last tank's loop innermost, without calls per node but the terms.
    const last = table[members[d - 1]!]!
    let sum = 0
    const walk = (level: number, pd: number, bi: number) => {
      if (level === d - 1) {
        for (let k = 0; k < nodes; k++) sum += occurrenceNetTotal(pd + last.pd[k]!, bi + last.bi[k]!, terms)
        return
      }
      const t = table[members[level]!]!
      for (let k = 0; k < nodes; k++) walk(level + 1, pd + t.pd[k]!, bi + t.bi[k]!)
    }
    walk(0, 0, 0)
    total += pb * sum / nodes ** d
  }
  return total
}

/**
 * Monte Carlo: the flash-ignited set is drawn conditioned on being non-empty (year mode's
 * drawOutcome), the spread as year mode draws it, each burning tank's damage from its own uniform
 * (one of MC_LEVELS equally likely midpoint levels of burningTankLoss, tabulated once per tank).
 * E = P(some ignition) × the conditional mean; se likewise.
 */
function monteCarloInsured(model: StormSiteLossModel, terms: SiteTerms, rand: UniformStream, samples: number): { mean: number, se: number } {
  const n = model.tanks.length
  const q = Float64Array.from(model.tanks, t => t.ignition)
  const none = new Float64Array(n + 1)
  const hit = new Uint8Array(n)
  const spread = spreadTableOf(model)
  const levels = levelTables(model, MC_LEVELS)
  const level = () => Math.min(MC_LEVELS - 1, Math.floor(rand() * MC_LEVELS))
  let anyIgnition = 1
  for (const qi of q) anyIgnition *= 1 - qi
  anyIgnition = 1 - anyIgnition
  if (!(anyIgnition > 0)) return { mean: 0, se: 0 }
  let sum = 0, sum2 = 0
  for (let s = 0; s < samples; s++) {
    drawOutcome(n, q, none, rand, hit)
    let pd = 0, bi = 0
    for (let t = 0; t < n; t++) {
      if (hit[t] !== 1) continue
      const k = level()
      pd += levels[t]!.pd[k]!
      bi += levels[t]!.bi[k]!
    }
    spreadFires(spread, n, hit, rand, (j) => {
      const k = level()
      pd += levels[j]!.pd[k]!
      bi += levels[j]!.bi[k]!
    })
    const x = occurrenceNetTotal(pd, bi, terms)
    sum += x
    sum2 += x * x
  }
  const mean = sum / samples
  const variance = samples > 1 ? Math.max(0, (sum2 - samples * mean * mean) / (samples - 1)) : 0
  return { mean: anyIgnition * mean, se: anyIgnition * Math.sqrt(variance / samples) }
}
