// Thinning envelope for simulating flashes that can matter (year mode, event bands).
// The (current, position) space around a site is cut into cells — current bins × annuli × sectors —
// and each cell gets an upper bound q on the probability that a flash in it strikes or sparks any
// tank. Candidate flashes are drawn from the Poisson process of intensity Ng·f(I)·q, and a candidate
// is kept with probability P(any event)/q: exact Poisson thinning, with no flash simulated in vain
// far from the tanks.
import type { PreparedSite } from './kernel'
import type { UniformStream } from './random'
import { canSpark, captureReach, sparkProbabilityLn, strikeRadius } from './kernel'
import { siteRelevantRadius } from './reach'

const CURRENT_BIN_RATIO = 1.2
const SHELL_RATIO = 1.2
const FIRST_SHELL_M = 2
const SECTORS = 12
/** Beyond this many object extents the angle hardly changes the bound: whole annuli. */
const SECTOR_ZONE_EXTENTS = 4

/** Fields of one cell, interleaved so a candidate touches one or two cache lines, not nine arrays. */
export const CELL_U_LO = 0, CELL_U_SPAN = 1, CELL_R0_SQ = 2, CELL_RING = 3, CELL_THETA0 = 4, CELL_D_THETA = 5, CELL_BOUND = 6, CELL_ALIAS_P = 7, CELL_ALIAS_J = 8
export const CELL_STRIDE = 9

export interface Envelope {
  readonly nCells: number
  /**
   * Per cell, at [cell·CELL_STRIDE + field]: truncated-law probability range of its current bin
   * (start, span), r0², r1² − r0², first angle and angular width, the bound q on
   * P(any direct strike or sparking | flash in the cell), and its alias-table entry.
   */
  readonly cells: Float64Array
  /** Candidate flashes per year in each cell: Ng·1e-6·area·P(I in bin)·q. */
  readonly rate: Float64Array
  readonly totalRate: number
}

/** The bound q of a cell. */
export function cellBoundOf(env: Envelope, cell: number): number {
  return env.cells[cell * CELL_STRIDE + CELL_BOUND]!
}

interface CellGeometry {
  r0: number; r1: number; theta0: number; dTheta: number; cx: number; cy: number; rho: number; whole: boolean
  /** Least distance from each object's axis to the cell (independent of the current: computed once). */
  objectDistance: Float64Array
}

/** Build the envelope of a prepared site; deterministic, no random numbers. */
export function buildEnvelope(ps: PreparedSite): Envelope {
  const law = ps.law
  const lnMin = Math.log(law.minKa)
  const lnMax = Math.log(law.maxKa)
  const nBins = Math.max(1, Math.ceil((lnMax - lnMin) / Math.log(CURRENT_BIN_RATIO)))
  const rMax = siteRelevantRadius(ps, law.maxKa)
  const geometry = cellGeometries(ps, rMax)
  // Upper bound on the cell count; filled in place (no per-cell garbage).
  const fields = new Float64Array(nBins * geometry.length * CELL_STRIDE)
  const rates = new Float64Array(nBins * geometry.length)
  const scratch = new Float64Array(ps.nObjects)
  let count = 0
  let uPrev = 0
  for (let b = 0; b < nBins; b++) {
    const lnHi = b === nBins - 1 ? lnMax : lnMin + (b + 1) * (lnMax - lnMin) / nBins
    const uHi = b === nBins - 1 ? 1 : law.cdf(Math.exp(lnHi))
    const mass = uHi - uPrev
    if (mass > 0) {
      const rBin = siteRelevantRadius(ps, Math.exp(lnHi))
      for (const g of geometry) {
        if (g.r0 >= rBin) continue
        const q = cellBound(ps, g, lnHi, scratch)
        if (q <= 0) continue
        const at = count * CELL_STRIDE
        fields[at + CELL_U_LO] = uPrev
        fields[at + CELL_U_SPAN] = mass
        fields[at + CELL_R0_SQ] = g.r0 * g.r0
        fields[at + CELL_RING] = g.r1 * g.r1 - g.r0 * g.r0
        fields[at + CELL_THETA0] = g.theta0
        fields[at + CELL_D_THETA] = g.dTheta
        fields[at + CELL_BOUND] = q
        rates[count] = ps.flashDensity * 1e-6 * 0.5 * g.dTheta * (g.r1 * g.r1 - g.r0 * g.r0) * mass * q
        count += 1
      }
    }
    uPrev = uHi
  }
  return finishEnvelope(fields.slice(0, count * CELL_STRIDE), rates.slice(0, count))
}

function finishEnvelope(cells: Float64Array, rate: Float64Array): Envelope {
  let totalRate = 0
  for (let c = 0; c < rate.length; c++) totalRate += rate[c]!
  const { prob, alias } = buildAlias(rate, totalRate)
  for (let c = 0; c < rate.length; c++) {
    cells[c * CELL_STRIDE + CELL_ALIAS_P] = prob[c]!
    cells[c * CELL_STRIDE + CELL_ALIAS_J] = alias[c]!
  }
  return { nCells: rate.length, cells, rate, totalRate }
}

/** Annuli from the site's reference point out to rMax, cut into sectors near the objects. */
function cellGeometries(ps: PreparedSite, rMax: number): CellGeometry[] {
  const out: CellGeometry[] = []
  const sectorLimit = ps.nObjects > 1 ? SECTOR_ZONE_EXTENTS * Math.max(ps.objExtent, FIRST_SHELL_M) : 0
  let r0 = 0
  let r1 = FIRST_SHELL_M
  while (r0 < rMax) {
    const sectors = r0 < sectorLimit ? SECTORS : 1
    const dTheta = 2 * Math.PI / sectors
    for (let k = 0; k < sectors; k++) out.push(withDistances(ps, sectorGeometry(r0, r1, k * dTheta, dTheta, sectors === 1)))
    r0 = r1
    r1 *= SHELL_RATIO
  }
  return out
}

function withDistances(ps: PreparedSite, g: Omit<CellGeometry, 'objectDistance'>): CellGeometry {
  const objectDistance = new Float64Array(ps.nObjects)
  for (let j = 0; j < ps.nObjects; j++) objectDistance[j] = distanceToCell(g, ps.objX[j]!, ps.objY[j]!)
  return { ...g, objectDistance }
}

/** A sector with its covering circle: centre on the mid-radius and mid-angle, radius to the furthest corner. */
function sectorGeometry(r0: number, r1: number, theta0: number, dTheta: number, whole: boolean): Omit<CellGeometry, 'objectDistance'> {
  if (whole) return { r0, r1, theta0, dTheta, cx: 0, cy: 0, rho: r1, whole }
  const rm = 0.5 * (r0 + r1)
  const mid = theta0 + 0.5 * dTheta
  const cosHalf = Math.cos(0.5 * dTheta)
  const corner = (r: number) => Math.sqrt(Math.max(0, r * r + rm * rm - 2 * r * rm * cosHalf))
  return { r0, r1, theta0, dTheta, cx: rm * Math.cos(mid), cy: rm * Math.sin(mid), rho: Math.max(corner(r0), corner(r1)), whole }
}

/** Least distance from a point to the cell (0 if inside). */
function distanceToCell(g: Omit<CellGeometry, 'objectDistance'>, x: number, y: number): number {
  if (g.whole) {
    const d = Math.sqrt(x * x + y * y)
    return Math.max(0, g.r0 - d, d - g.r1)
  }
  const dx = x - g.cx
  const dy = y - g.cy
  return Math.max(0, Math.sqrt(dx * dx + dy * dy) - g.rho)
}

/**
 * Upper bound on P(any tank struck or sparking) for flashes in the cell with current ≤ e^{lnIHi}:
 * 1 if the cell touches any tank's capture zone; otherwise Σ_t of tank t's sparking probability at
 * the largest current and at the least distance the attachment point can have — the nearest point
 * of the cell, or any structure whose capture zone touches the cell.
 */
function cellBound(ps: PreparedSite, g: CellGeometry, lnIHi: number, reachableStructures: Float64Array): number {
  const rs = strikeRadius(ps, lnIHi)
  const current = Math.exp(lnIHi)
  const distance = g.objectDistance
  for (let t = 0; t < ps.nTanks; t++) {
    if (distance[t]! < captureReach(ps, t, rs)) return 1
  }
  let reachable = 0
  for (let j = ps.nTanks; j < ps.nObjects; j++) {
    if (distance[j]! < captureReach(ps, j, rs)) reachableStructures[reachable++] = j
  }
  let q = 0
  for (let t = 0; t < ps.nTanks; t++) {
    if (!canSpark(ps, t, current)) continue
    let y = distance[t]!
    for (let k = 0; k < reachable; k++) {
      const j = reachableStructures[k]!
      y = Math.min(y, ps.pairDistance[t * ps.nObjects + j]!)
    }
    q += sparkProbabilityLn(ps, t, lnIHi, y > 0 ? Math.log(y) : -745)
    if (q >= 1) return 1
  }
  return q
}

/** Walker–Vose alias table: O(1) draws from a discrete distribution. */
function buildAlias(weights: Float64Array, total: number): { prob: Float64Array; alias: Int32Array } {
  const n = weights.length
  const prob = new Float64Array(n)
  const alias = new Int32Array(n)
  const scaled = Float64Array.from(weights, (w) => (total > 0 ? w * n / total : 1))
  const small: number[] = []
  const large: number[] = []
  for (let i = 0; i < n; i++) (scaled[i]! < 1 ? small : large).push(i)
  while (small.length > 0 && large.length > 0) {
    const s = small.pop()!
    const l = large.pop()!
    prob[s] = scaled[s]!
    alias[s] = l
    scaled[l] = scaled[l]! + scaled[s]! - 1
    ;(scaled[l]! < 1 ? small : large).push(l)
  }
  for (const i of [...small, ...large]) { prob[i] = 1; alias[i] = i }
  return { prob, alias }
}

const TRIG_STEPS = 4096
const TRIG_STEP = 2 * Math.PI / TRIG_STEPS
const INV_TRIG_STEP = 1 / TRIG_STEP
const COS_TABLE = Float64Array.from({ length: TRIG_STEPS }, (_, k) => Math.cos(k * TRIG_STEP))
const SIN_TABLE = Float64Array.from({ length: TRIG_STEPS }, (_, k) => Math.sin(k * TRIG_STEP))

/** A candidate flash: site-relative position, current, and its cell (for the bound). */
export interface Candidate { x: number; y: number; currentKa: number; lnI: number; cell: number }

/** Draw one candidate into `out` (reused: no allocation per flash). */
export function drawCandidate(ps: PreparedSite, env: Envelope, rand: UniformStream, out: Candidate): void {
  const cells = env.cells
  const pick = rand() * env.nCells
  let cell = Math.min(env.nCells - 1, Math.floor(pick))
  let at = cell * CELL_STRIDE
  if (pick - cell >= cells[at + CELL_ALIAS_P]!) {
    cell = cells[at + CELL_ALIAS_J]!
    at = cell * CELL_STRIDE
  }
  const lnI = ps.law.logQuantile(cells[at + CELL_U_LO]! + rand() * cells[at + CELL_U_SPAN]!)
  const r = Math.sqrt(cells[at + CELL_R0_SQ]! + rand() * cells[at + CELL_RING]!)
  const theta = cells[at + CELL_THETA0]! + rand() * cells[at + CELL_D_THETA]!
  // cos and sin from a table plus the angle-addition formulas with short series for the remainder
  // δ < 2π/4096 (truncation error below δ⁵/120 ≈ 6e-17): exact in double precision, and about
  // three times cheaper than Math.cos + Math.sin, which took a third of a candidate's time.
  const k = Math.min(TRIG_STEPS - 1, (theta * INV_TRIG_STEP) | 0)
  const d = theta - k * TRIG_STEP
  const d2 = d * d
  const cosD = 1 - d2 * (0.5 - d2 / 24)
  const sinD = d * (1 - d2 / 6)
  out.x = r * (COS_TABLE[k]! * cosD - SIN_TABLE[k]! * sinD)
  out.y = r * (SIN_TABLE[k]! * cosD + COS_TABLE[k]! * sinD)
  out.currentKa = Math.exp(lnI)
  out.lnI = lnI
  out.cell = cell
}
