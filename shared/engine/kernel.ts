// The hot path: a site compiled to typed arrays, and per-flash attachment + induced potential +
// sparking probability without allocation. Every estimator (frequency, year, heat maps, bands)
// goes through these functions so they cannot disagree about the physics.
import type { SiteInput, TankInput, ComponentClass, AttachmentModel } from './types'
import { COMPONENT_CLASSES } from './types'
import type { AssumptionSet } from './assumptions'
import type { TruncatedCurrentLaw } from './current'
import { currentLawFromSpec, truncate } from './current'
import { couplingCoefficient } from './induction'
import { hasInducedSparking, ignitionGivenDirect, ignitionGivenSpark } from './ignition'
import type { SpreadTable, TankLoss } from './loss'
import { expectedBurningTankLoss, expectedFireLoss, spreadTable } from './loss'

/** σ = 0 (sharp threshold) is run as a very steep log-normal: exact except on a set of measure zero. */
const SHARP_INV_SIGMA = 1e12

export interface PreparedSite {
  readonly siteId: string
  readonly flashDensity: number
  readonly attachmentModel: AttachmentModel
  /** Site reference point (centre of the bounding box) in input coordinates; all arrays below are relative to it. */
  readonly centreX: number
  readonly centreY: number
  // Objects that can capture a flash: tanks first (object t is tank t), then structures.
  readonly nObjects: number
  readonly objX: Float64Array
  readonly objY: Float64Array
  readonly objRadius: Float64Array
  readonly objHeight: Float64Array
  /** Distance and bearing from tank t's axis to object j's axis, at [t·nObjects + j]. */
  readonly pairDistance: Float64Array
  readonly pairAngle: Float64Array
  /** Largest |c_j| + a_j over objects: beyond it plus the capture reach, the ground always wins. */
  readonly objExtent: number
  readonly maxObjHeight: number
  // Tanks
  readonly nTanks: number
  readonly tanks: readonly TankInput[]
  /** −1 when unshielded: sparking is impossible for I ≤ the rating. */
  readonly tankShieldKa: Float64Array
  readonly tankSparkable: Uint8Array
  readonly classStart: Int32Array
  /** ln(Kc·h/U50) per component class entry: z = (ln I − ln y + this)·invSigma. */
  readonly classLogCoef: Float64Array
  readonly classInvSigma: Float64Array
  readonly classCount: Float64Array
  /** ln of the distance floor max(h, a) of Rusk's formula. */
  readonly classLogFloor: Float64Array
  readonly classKind: Int32Array
  readonly pIgnDirect: Float64Array
  readonly pIgnSpark: Float64Array
  /** Expected loss of a fire that starts at the tank, spread to neighbours included (money). */
  readonly severity: Float64Array
  /** Expected loss of the tank's own fire, per component and PD / BI (money). */
  readonly expectedLoss: readonly TankLoss[]
  /** Neighbours a fire at each tank can reach, with the probability (MODEL.md §4). */
  readonly spread: SpreadTable
  readonly damageRatio: AssumptionSet['damageRatio']
  /** y50(I) = I·this: distance at which the tank's sparking probability is 0.5 (no floor). */
  readonly tankSpark50PerKa: Float64Array
  /** y(I) = I·this: beyond it the tank's sparking probability is below the cutoff. */
  readonly tankSparkReachPerKa: Float64Array
  /** Largest σ among the tank's classes (sets the width of its sparking band). */
  readonly tankSigma: Float64Array
  /**
   * Tabulated sparking probability per tank (see sparkTables): nodes of P and h·dP/dx over
   * x = ln I − ln y from tableX0[t] in steps of 1/tableInvStep[t]; tableLength[t] = 0 means "compute
   * exactly" (sharp thresholds). Valid where ln y ≥ tankLogFloor[t] (no distance floor active).
   */
  readonly tableStart: Int32Array
  readonly tableLength: Int32Array
  readonly tableX0: Float64Array
  readonly tableInvStep: Float64Array
  /** Interleaved nodes: [P_0, h·P'_0, P_1, h·P'_1, …]; tableStart counts nodes, not entries. */
  readonly tableNodes: Float64Array
  readonly tankLogFloor: Float64Array
  // Physics
  readonly law: TruncatedCurrentLaw
  readonly strikeA: number
  readonly strikeB: number
  readonly groundFactor: number
  readonly coupling: number
  readonly cutoffProbability: number
}

/** Compile a site and an assumption set for the kernel. */
export function prepareSite(site: SiteInput, a: AssumptionSet): PreparedSite {
  const tanks = site.tanks
  const structures = site.structures
  const nT = tanks.length
  const n = nT + structures.length
  const xs = [...tanks.map((t) => t.xM), ...structures.map((s) => s.xM)]
  const ys = [...tanks.map((t) => t.yM), ...structures.map((s) => s.yM)]
  const centreX = n > 0 ? (Math.min(...xs) + Math.max(...xs)) / 2 : 0
  const centreY = n > 0 ? (Math.min(...ys) + Math.max(...ys)) / 2 : 0
  const objX = Float64Array.from(xs, (x) => x - centreX)
  const objY = Float64Array.from(ys, (y) => y - centreY)
  const objRadius = Float64Array.from([...tanks.map((t) => t.diameterM / 2), ...structures.map((s) => s.radiusM)])
  const objHeight = Float64Array.from([...tanks.map((t) => t.heightM), ...structures.map((s) => s.heightM)])
  let objExtent = 0
  for (let j = 0; j < n; j++) objExtent = Math.max(objExtent, Math.hypot(objX[j]!, objY[j]!) + objRadius[j]!)
  const coupling = couplingCoefficient(a)
  const classes = compileClasses(tanks, a, coupling, objRadius)
  const law = truncate(currentLawFromSpec(lawSpec(a)), a.currentMinKa, a.currentMaxKa)
  const { pairDistance, pairAngle } = pairGeometry(nT, objX, objY)
  const expectedLoss = tanks.map((t) => expectedBurningTankLoss(t, a))
  const spread = spreadTable(site, a)
  const partial = {
    pairDistance, pairAngle,
    siteId: site.id, flashDensity: site.flashDensity, attachmentModel: a.attachmentModel, centreX, centreY,
    nObjects: n, objX, objY, objRadius, objHeight, objExtent, maxObjHeight: n > 0 ? Math.max(...objHeight) : 0,
    nTanks: nT, tanks,
    tankShieldKa: Float64Array.from(tanks, (t) => t.shieldRatingKa ?? -1),
    tankSparkable: Uint8Array.from(tanks, (t) => (hasInducedSparking(t) ? 1 : 0)),
    ...classes,
    pIgnDirect: Float64Array.from(tanks, (t) => ignitionGivenDirect(t, a)),
    pIgnSpark: Float64Array.from(tanks, (t) => ignitionGivenSpark(t, a)),
    severity: Float64Array.from(tanks, (_, t) => expectedFireLoss(t, expectedLoss, spread)),
    expectedLoss, spread, damageRatio: a.damageRatio,
    law, strikeA: a.strikingDistanceA, strikeB: a.strikingDistanceB, groundFactor: a.groundStrikingFactor,
    coupling, cutoffProbability: a.cutoffProbability,
  }
  return { ...partial, ...sparkScales(partial), ...sparkTables(partial) }
}

function pairGeometry(nT: number, objX: Float64Array, objY: Float64Array) {
  const n = objX.length
  const pairDistance = new Float64Array(nT * n)
  const pairAngle = new Float64Array(nT * n)
  for (let t = 0; t < nT; t++) {
    for (let j = 0; j < n; j++) {
      const dx = objX[j]! - objX[t]!
      const dy = objY[j]! - objY[t]!
      pairDistance[t * n + j] = Math.sqrt(dx * dx + dy * dy)
      pairAngle[t * n + j] = Math.atan2(dy, dx)
    }
  }
  return { pairDistance, pairAngle }
}

export function lawSpec(a: AssumptionSet): import('./current').CurrentLawSpec {
  switch (a.currentLaw) {
    case 'power_law': return { kind: 'power_law', medianKa: a.powerLawMedianKa, exponent: a.powerLawExponent }
    case 'lognormal': return { kind: 'lognormal', medianKa: a.lognormalMedianKa, beta: a.lognormalBeta }
    case 'empirical': return { kind: 'empirical', currentsKa: a.empiricalCurrentsKa }
  }
}

function compileClasses(tanks: readonly TankInput[], a: AssumptionSet, coupling: number, radius: Float64Array) {
  const start: number[] = [0]
  const logCoef: number[] = [], invSigma: number[] = [], count: number[] = [], logFloor: number[] = [], kind: number[] = []
  const sigmaMax: number[] = []
  tanks.forEach((tank, t) => {
    let sMax = 0
    if (hasInducedSparking(tank)) {
      for (const c of tank.components) {
        if (c.count <= 0) continue
        const th = a.thresholds[c.componentClass]
        logCoef.push(Math.log(coupling * c.heightM / th.u50Kv))
        invSigma.push(th.sigma > 0 ? 1 / th.sigma : SHARP_INV_SIGMA)
        count.push(c.count)
        logFloor.push(Math.log(Math.max(c.heightM, radius[t]!)))
        kind.push(COMPONENT_CLASSES.indexOf(c.componentClass))
        sMax = Math.max(sMax, th.sigma)
      }
    }
    start.push(logCoef.length)
    sigmaMax.push(sMax)
  })
  return {
    classStart: Int32Array.from(start), classLogCoef: Float64Array.from(logCoef), classInvSigma: Float64Array.from(invSigma),
    classCount: Float64Array.from(count), classLogFloor: Float64Array.from(logFloor), classKind: Int32Array.from(kind),
    tankSigma: Float64Array.from(sigmaMax),
  }
}

type SparkScaleInput = Pick<PreparedSite, 'nTanks' | 'classStart' | 'classLogCoef' | 'classInvSigma' | 'classCount' | 'cutoffProbability' | 'classLogFloor'>

/** Steps per σ of the tables: cubic Hermite error ~ (step·z/σ)⁴/384, below 1e-6 relative for |z| < 8. */
const TABLE_STEPS_PER_SIGMA = 64
/** Thresholds sharper than this are computed exactly: a table cannot follow a near-step. */
const TABLE_MIN_SIGMA = 0.05

/**
 * Without an active distance floor a tank's sparking probability depends only on x = ln I − ln y.
 * The hot loops read it from a per-tank table of P and dP/dx with cubic Hermite interpolation
 * instead of evaluating Φ for every class: one lookup instead of several exp calls. The table runs
 * from where every class is below Φ(−9.5) (P < 1e-20: taken as 0) to where one class is above
 * Φ(8.3) (P = 1 in double precision).
 */
function sparkTables(ps: SparkScaleInput) {
  const start = new Int32Array(ps.nTanks)
  const length = new Int32Array(ps.nTanks)
  const x0 = new Float64Array(ps.nTanks)
  const invStep = new Float64Array(ps.nTanks)
  const logFloor = new Float64Array(ps.nTanks)
  const nodes: number[] = []
  for (let t = 0; t < ps.nTanks; t++) {
    const first = ps.classStart[t]!
    const end = ps.classStart[t + 1]!
    if (first === end) continue
    let lo = Infinity, hi = Infinity, sigmaMin = Infinity, floor = -Infinity
    for (let c = first; c < end; c++) {
      const sigma = 1 / ps.classInvSigma[c]!
      lo = Math.min(lo, -ps.classLogCoef[c]! - 9.5 * sigma)
      hi = Math.min(hi, -ps.classLogCoef[c]! + 8.3 * sigma)
      sigmaMin = Math.min(sigmaMin, sigma)
      floor = Math.max(floor, ps.classLogFloor[c]!)
    }
    logFloor[t] = floor
    if (sigmaMin < TABLE_MIN_SIGMA) continue
    const step = sigmaMin / TABLE_STEPS_PER_SIGMA
    const n = Math.ceil((hi - lo) / step) + 2
    start[t] = nodes.length / 2
    length[t] = n
    x0[t] = lo
    invStep[t] = 1 / step
    for (let i = 0; i < n; i++) {
      const { p, slope } = unflooredSparkAndSlope(ps, t, lo + i * step)
      nodes.push(p, slope * step)
    }
  }
  return {
    tableStart: start, tableLength: length, tableX0: x0, tableInvStep: invStep, tankLogFloor: logFloor,
    tableNodes: Float64Array.from(nodes),
  }
}

/** P(x) = 1 − Π q_k^{n_k} and dP/dx = (1 − P)·Σ n_k·φ(z_k)/(σ_k·q_k), q_k = 1 − Φ(z_k). */
function unflooredSparkAndSlope(ps: SparkScaleInput, t: number, x: number): { p: number; slope: number } {
  let survive = 1
  let rate = 0
  for (let c = ps.classStart[t]!; c < ps.classStart[t + 1]!; c++) {
    const invSigma = ps.classInvSigma[c]!
    const z = (x + ps.classLogCoef[c]!) * invSigma
    const q = phi(-z)
    const n = ps.classCount[c]!
    survive *= Math.pow(q, n)
    if (q > 0) rate += n * Math.exp(-0.5 * z * z) / Math.sqrt(2 * Math.PI) * invSigma / q
  }
  return { p: 1 - survive, slope: survive * rate }
}

/**
 * Without the distance floor a tank's sparking probability depends on I and y only through
 * x = ln(I/y), so the distances where it crosses 0.5 and the cutoff scale with I; found once per
 * tank by bisection on x.
 */
function sparkScales(ps: SparkScaleInput) {
  const half = new Float64Array(ps.nTanks)
  const reach = new Float64Array(ps.nTanks)
  for (let t = 0; t < ps.nTanks; t++) {
    if (ps.classStart[t] === ps.classStart[t + 1]) continue
    half[t] = Math.exp(-solveX(ps, t, 0.5))
    reach[t] = Math.exp(-solveX(ps, t, ps.cutoffProbability))
  }
  return { tankSpark50PerKa: half, tankSparkReachPerKa: reach }
}

function solveX(ps: SparkScaleInput, t: number, target: number): number {
  let lo = -60
  let hi = 60
  // 64 halvings of a width of 120 reach double precision.
  for (let k = 0; k < 64; k++) {
    const mid = 0.5 * (lo + hi)
    if (unflooredSpark(ps, t, mid) < target) lo = mid
    else hi = mid
  }
  return hi
}

function unflooredSpark(ps: SparkScaleInput, t: number, x: number): number {
  let survive = 1
  for (let c = ps.classStart[t]!; c < ps.classStart[t + 1]!; c++) {
    const p = phi((x + ps.classLogCoef[c]!) * ps.classInvSigma[c]!)
    survive *= Math.pow(1 - p, ps.classCount[c]!)
  }
  return 1 - survive
}

/**
 * Φ(z) through the complementary error function "erfcc" of Numerical Recipes in C, 2nd ed. §6.2
 * (fractional error < 1.2e-7 everywhere). Inlined here so the hot loop has no call into another module.
 */
export function phi(z: number): number {
  if (z < -38) return 0
  if (z > 38) return 1
  const x = -z * Math.SQRT1_2
  const ax = x < 0 ? -x : x
  const t = 1 / (1 + 0.5 * ax)
  const r = t * Math.exp(-ax * ax - 1.26551223 + t * (1.00002368 + t * (0.37409196 + t * (0.09678418
    + t * (-0.18628806 + t * (0.27886807 + t * (-1.13520398 + t * (1.48851587
    + t * (-0.82215223 + t * 0.17087277)))))))))
  return 0.5 * (x >= 0 ? r : 2 - r)
}

/** Striking distance rs = A·I^b from ln I (one exp instead of a pow). */
export function strikeRadius(ps: PreparedSite, lnI: number): number {
  return ps.strikeA * Math.exp(ps.strikeB * lnI)
}

/** Horizontal reach of object j's capture zone from its axis: a + rs (EGM) or a + 3H (IEC 62305-2). */
export function captureReach(ps: PreparedSite, j: number, rs: number): number {
  return ps.attachmentModel === 'egm' ? ps.objRadius[j]! + rs : ps.objRadius[j]! + 3 * ps.objHeight[j]!
}

/**
 * The object that captures a vertical leader above (px, py) (site-relative), or −1 for the ground.
 * EGM: greatest capture height, the ground at rg = kg·rs, object j at H_j + sqrt(rs² − d_j²) for
 * d_j = max(0, |p − c_j| − a_j) < rs. Collection area: the tallest object within 3H of its edge.
 */
export function attachFlash(ps: PreparedSite, px: number, py: number, rs: number): number {
  const d2c = px * px + py * py
  if (ps.attachmentModel === 'egm') {
    const far = ps.objExtent + rs
    if (d2c >= far * far) return -1
    return attachEgm(ps, px, py, rs)
  }
  const far = ps.objExtent + 3 * ps.maxObjHeight
  if (d2c >= far * far) return -1
  return attachCollectionArea(ps, px, py)
}

function attachEgm(ps: PreparedSite, px: number, py: number, rs: number): number {
  const { objX, objY, objRadius, objHeight, nObjects } = ps
  let best = ps.groundFactor * rs
  let winner = -1
  const rs2 = rs * rs
  for (let j = 0; j < nObjects; j++) {
    const dx = px - objX[j]!
    const dy = py - objY[j]!
    const reach = rs + objRadius[j]!
    const d2 = dx * dx + dy * dy
    if (d2 >= reach * reach) continue
    let d = Math.sqrt(d2) - objRadius[j]!
    if (d < 0) d = 0
    const h = objHeight[j]! + Math.sqrt(rs2 - d * d)
    if (h > best) { best = h; winner = j }
  }
  return winner
}

function attachCollectionArea(ps: PreparedSite, px: number, py: number): number {
  const { objX, objY, objRadius, objHeight, nObjects } = ps
  let bestH = 0
  let winner = -1
  for (let j = 0; j < nObjects; j++) {
    const dx = px - objX[j]!
    const dy = py - objY[j]!
    const reach = objRadius[j]! + 3 * objHeight[j]!
    if (dx * dx + dy * dy >= reach * reach) continue
    if (objHeight[j]! > bestH) { bestH = objHeight[j]!; winner = j }
  }
  return winner
}

/**
 * Sparking probability of tank t for a flash of ln-current lnI attaching at horizontal distance
 * with ln(y) = lnY from its axis: 1 − Π_k (1 − Φ((ln I + ln(Kc·h_k/U50_k) − ln max(y, floor_k)) / σ_k))^n_k.
 * The shield and steel checks are the caller's (they depend on I, not on geometry).
 */
export function sparkProbabilityLn(ps: PreparedSite, t: number, lnI: number, lnY: number): number {
  const n = ps.tableLength[t]!
  if (n > 0 && lnY >= ps.tankLogFloor[t]!) return tableLookup(ps.tableNodes, ps.tableStart[t]!, n, (lnI - lnY - ps.tableX0[t]!) * ps.tableInvStep[t]!)
  return exactSparkProbabilityLn(ps, t, lnI, lnY)
}

/** Cubic Hermite interpolation at fractional node position u of a table of n nodes starting at node `first`. */
function tableLookup(nodes: Float64Array, first: number, n: number, u: number): number {
  if (u <= 0) return 0
  if (u >= n - 1) return nodes[2 * (first + n - 1)]!
  const i = u | 0
  const f = u - i
  const k = 2 * (first + i)
  const f2 = f * f
  const f3 = f2 * f
  return (2 * f3 - 3 * f2 + 1) * nodes[k]! + (f3 - 2 * f2 + f) * nodes[k + 1]!
    + (3 * f2 - 2 * f3) * nodes[k + 2]! + (f3 - f2) * nodes[k + 3]!
}

/** The same without the table: 1 − Π_k (1 − Φ(z_k))^n_k with the distance floors applied. */
export function exactSparkProbabilityLn(ps: PreparedSite, t: number, lnI: number, lnY: number): number {
  const end = ps.classStart[t + 1]!
  const logFloor = ps.classLogFloor
  const logCoef = ps.classLogCoef
  const invSigma = ps.classInvSigma
  const count = ps.classCount
  let survive = 1
  for (let c = ps.classStart[t]!; c < end; c++) {
    const floor = logFloor[c]!
    const z = (lnI + logCoef[c]! - (lnY > floor ? lnY : floor)) * invSigma[c]!
    // Φ(−9) ≈ 1e-19: below any figure the engine reports, and it saves the exp.
    if (z < -9) continue
    survive *= survivalOfItems(phi(-z), count[c]!)
  }
  return 1 - survive
}

/** (1 − p)^n from q = 1 − p: repeated products for the usual small counts, pow beyond. */
function survivalOfItems(q: number, n: number): number {
  if (n === 1) return q
  if (n > 8) return Math.pow(q, n)
  let out = q
  for (let k = 1; k < n; k++) out *= q
  return out
}

/** The same for one class alone (used to name the class that drives a tank's sparking). */
export function classSparkProbabilityLn(ps: PreparedSite, c: number, lnI: number, lnY: number): number {
  const floor = ps.classLogFloor[c]!
  const z = (lnI + ps.classLogCoef[c]! - (lnY > floor ? lnY : floor)) * ps.classInvSigma[c]!
  if (z < -9) return 0
  return 1 - survivalOfItems(phi(-z), ps.classCount[c]!)
}

/** Can tank t spark at current I at all (not steel, has components, above its shield rating)? */
export function canSpark(ps: PreparedSite, t: number, currentKa: number): boolean {
  return ps.tankSparkable[t] === 1 && currentKa > ps.tankShieldKa[t]!
}

/**
 * Sparking probability of tank t for a flash that attached to object `attached` (−1: the ground at
 * (px, py)). A direct strike on t returns 0: it is counted as a direct strike, not induced sparking.
 */
export function tankSparkGivenAttachment(ps: PreparedSite, t: number, currentKa: number, lnI: number, attached: number, px: number, py: number): number {
  if (attached === t || !canSpark(ps, t, currentKa)) return 0
  const qx = attached < 0 ? px : ps.objX[attached]!
  const qy = attached < 0 ? py : ps.objY[attached]!
  const dx = qx - ps.objX[t]!
  const dy = qy - ps.objY[t]!
  const d2 = dx * dx + dy * dy
  // ln y = ½ ln y²; y = 0 (a flash on a structure at the tank's own axis) falls to the floor.
  const lnY = d2 > 0 ? 0.5 * Math.log(d2) : -745
  return sparkProbabilityLn(ps, t, lnI, lnY)
}

/**
 * Every tank's event probability for one flash that attached to `attached` (−1: the ground at
 * (px, py)): 1 for the struck tank, its sparking probability for the others. Writes `out[t]` and
 * returns the probability that no tank has an event, Π(1 − p_t).
 */
export function siteEventProbabilities(ps: PreparedSite, currentKa: number, lnI: number, attached: number, px: number, py: number, out: Float64Array): number {
  const nT = ps.nTanks
  const objX = ps.objX
  const objY = ps.objY
  const shield = ps.tankShieldKa
  const sparkable = ps.tankSparkable
  const length = ps.tableLength
  const logFloor = ps.tankLogFloor
  const x0 = ps.tableX0
  const invStep = ps.tableInvStep
  const start = ps.tableStart
  const nodes = ps.tableNodes
  const qx = attached < 0 ? px : objX[attached]!
  const qy = attached < 0 ? py : objY[attached]!
  let none = 1
  for (let t = 0; t < nT; t++) {
    if (attached === t) { out[t] = 1; none = 0; continue }
    if (sparkable[t] !== 1 || currentKa <= shield[t]!) { out[t] = 0; continue }
    const dx = qx - objX[t]!
    const dy = qy - objY[t]!
    const d2 = dx * dx + dy * dy
    const lnY = d2 > 0 ? 0.5 * Math.log(d2) : -745
    const n = length[t]!
    const p = n > 0 && lnY >= logFloor[t]!
      ? tableLookup(nodes, start[t]!, n, (lnI - lnY - x0[t]!) * invStep[t]!)
      : exactSparkProbabilityLn(ps, t, lnI, lnY)
    out[t] = p
    none *= 1 - p
  }
  return none
}

/**
 * Kernel for the benchmark and batch callers: for each flash (site-relative x, y, current), attach it
 * once and accumulate every tank's sparking probability into `out[t]` and its direct-strike
 * indicator into `out[nTanks + t]`, using `scratch` (length ≥ nTanks). Returns the number of
 * flash–tank evaluations.
 */
export function evaluateFlashes(ps: PreparedSite, flashX: Float64Array, flashY: Float64Array, flashI: Float64Array, out: Float64Array, scratch: Float64Array): number {
  const nT = ps.nTanks
  const count = flashX.length
  for (let f = 0; f < count; f++) {
    const current = flashI[f]!
    const lnI = Math.log(current)
    const px = flashX[f]!
    const py = flashY[f]!
    const attached = attachFlash(ps, px, py, strikeRadius(ps, lnI))
    siteEventProbabilities(ps, current, lnI, attached, px, py, scratch)
    for (let t = 0; t < nT; t++) {
      if (attached === t) out[nT + t]! += 1
      else out[t]! += scratch[t]!
    }
  }
  return count * nT
}

/** Scratch space for directCaptureFraction (two entries per object: an arc may wrap and split). */
export interface ArcScratch { start: Float64Array; end: Float64Array }

export function createArcScratch(ps: PreparedSite): ArcScratch {
  return { start: new Float64Array(2 * ps.nObjects + 2), end: new Float64Array(2 * ps.nObjects + 2) }
}

/**
 * Share of the circle of radius r about tank t's axis on which a flash of striking distance rs
 * attaches to t — the direct-strike probability averaged over direction, exactly. Each other object
 * j beats t inside a disc about its own axis (EGM: where its capture height exceeds t's on that
 * circle; collection area: its 3H disc if it is taller), which cuts an arc off the circle; the
 * arcs' union is what t loses.
 */
export function directCaptureFraction(ps: PreparedSite, t: number, rs: number, r: number, arcs: ArcScratch): number {
  const egm = ps.attachmentModel === 'egm'
  const at = ps.objRadius[t]!
  const ht = ps.objHeight[t]!
  let score = 0
  if (egm) {
    const dt = r > at ? r - at : 0
    if (dt >= rs) return 0
    score = ht + Math.sqrt(rs * rs - dt * dt)
    if (score <= ps.groundFactor * rs) return 0
  } else if (r >= at + 3 * ht) return 0
  const n = ps.nObjects
  let count = 0
  for (let j = 0; j < n; j++) {
    if (j === t) continue
    const hj = ps.objHeight[j]!
    let rho: number
    if (egm) {
      const gap = score - hj
      if (gap >= rs) continue
      rho = ps.objRadius[j]! + (gap <= 0 ? rs : Math.sqrt(rs * rs - gap * gap))
    } else {
      // The first of equally tall objects wins (attachCollectionArea keeps a strictly taller one).
      if (hj < ht || (hj === ht && j > t)) continue
      rho = ps.objRadius[j]! + 3 * hj
    }
    const L = ps.pairDistance[t * n + j]!
    if (r + L <= rho) return 0
    if (r >= L + rho || L >= r + rho) continue
    const cosA = (r * r + L * L - rho * rho) / (2 * r * L)
    const half = Math.acos(cosA > 1 ? 1 : cosA < -1 ? -1 : cosA)
    count = addArc(arcs, count, ps.pairAngle[t * n + j]! - half, ps.pairAngle[t * n + j]! + half)
  }
  return 1 - arcUnion(arcs, count) / (2 * Math.PI)
}

/** Add [a, b] (a ≥ −2π, b ≤ 2π) to the list as pieces inside [−π, π]. */
function addArc(arcs: ArcScratch, count: number, a: number, b: number): number {
  const PI = Math.PI
  if (a < -PI) {
    arcs.start[count] = a + 2 * PI; arcs.end[count++] = PI
    arcs.start[count] = -PI; arcs.end[count++] = b
  } else if (b > PI) {
    arcs.start[count] = a; arcs.end[count++] = PI
    arcs.start[count] = -PI; arcs.end[count++] = b - 2 * PI
  } else {
    arcs.start[count] = a; arcs.end[count++] = b
  }
  return count
}

/** Total length of the union of the intervals (insertion sort: a handful of arcs). */
function arcUnion(arcs: ArcScratch, count: number): number {
  const { start, end } = arcs
  for (let i = 1; i < count; i++) {
    const s = start[i]!
    const e = end[i]!
    let k = i - 1
    while (k >= 0 && start[k]! > s) { start[k + 1] = start[k]!; end[k + 1] = end[k]!; k-- }
    start[k + 1] = s
    end[k + 1] = e
  }
  let covered = 0
  let curS = -Infinity
  let curE = -Infinity
  for (let i = 0; i < count; i++) {
    if (start[i]! > curE) {
      if (curE > curS) covered += curE - curS
      curS = start[i]!
      curE = end[i]!
    } else if (end[i]! > curE) curE = end[i]!
  }
  if (curE > curS) covered += curE - curS
  return covered
}

export function componentClassOf(ps: PreparedSite, c: number): ComponentClass {
  return COMPONENT_CLASSES[ps.classKind[c]!]!
}
