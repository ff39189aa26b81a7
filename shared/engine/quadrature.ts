// Deterministic reference for one isolated tank (MODEL.md §6):
//   sparking = Ng·1e-6 · ∫ f_I(i) ∫_{y > D(i)} 2πy·Psp(i, y) dy di,   direct = Ng·1e-6 · ∫ f_I(i)·πD(i)² di,
// by composite Gauss–Legendre quadrature in ln I and ln y. Used by the tests and by the what-if panel.
import type { AttachmentModel, TankInput } from './types'
import type { AssumptionSet } from './assumptions'
import type { PreparedSite } from './kernel'
import { canSpark, exactSparkProbabilityLn, prepareSite } from './kernel'
import { isolatedCaptureRadius } from './attachment'

export interface QuadratureResult {
  attachmentModel: AttachmentModel
  directPerYear: number
  sparkingPerYear: number
  ignitionPerYear: number
  expectedAnnualLoss: number
}

// 10-point Gauss–Legendre nodes and weights on [−1, 1] (Abramowitz & Stegun, Table 25.4).
const GL_X = [-0.9739065285171717, -0.8650633666889845, -0.6794095682990244, -0.4333953941292472, -0.1488743389816312,
  0.1488743389816312, 0.4333953941292472, 0.6794095682990244, 0.8650633666889845, 0.9739065285171717]
const GL_W = [0.0666713443086881, 0.1494513491505806, 0.2190863625159820, 0.2692667193099963, 0.2955242247147529,
  0.2955242247147529, 0.2692667193099963, 0.2190863625159820, 0.1494513491505806, 0.0666713443086881]

/** ∫ f over [a, b] split at the given breakpoints into panels no wider than maxWidth. */
function integrate(f: (x: number) => number, a: number, b: number, maxWidth: number, breaks: readonly number[] = []): number {
  if (!(b > a)) return 0
  const edges = [a, ...breaks.filter((x) => x > a && x < b).sort((x, y) => x - y), b]
  let total = 0
  for (let e = 0; e + 1 < edges.length; e++) {
    const lo = edges[e]!
    const hi = edges[e + 1]!
    const panels = Math.max(1, Math.ceil((hi - lo) / maxWidth))
    const h = (hi - lo) / panels
    for (let p = 0; p < panels; p++) {
      const mid = lo + (p + 0.5) * h
      let sum = 0
      for (let k = 0; k < GL_X.length; k++) sum += GL_W[k]! * f(mid + 0.5 * h * GL_X[k]!)
      total += 0.5 * h * sum
    }
  }
  return total
}

export interface QuadratureOptions { /** Panels are `resolution` times narrower (convergence checks). */ resolution?: number }

/** Direct-strike, induced-sparking and ignition frequencies of one tank standing alone. */
export function isolatedTankQuadrature(tank: TankInput, flashDensity: number, assumptions: AssumptionSet, options: QuadratureOptions = {}): QuadratureResult {
  const ps = prepareSite({ id: 'isolated', name: '', flashDensity, tanks: [{ ...tank, xM: 0, yM: 0 }], structures: [] }, assumptions)
  const resolution = options.resolution ?? 1
  const direct = integrateOverCurrent(ps, assumptions, tank, (i) => directArea(ps, i), resolution)
  const sparking = integrateOverCurrent(ps, assumptions, tank, (i) => sparkingArea(ps, i, resolution), resolution)
  const scale = flashDensity * 1e-6
  const directPerYear = scale * direct
  const sparkingPerYear = scale * sparking
  const ignitionPerYear = ps.pIgnDirect[0]! * directPerYear + ps.pIgnSpark[0]! * sparkingPerYear
  return { attachmentModel: assumptions.attachmentModel, directPerYear, sparkingPerYear, ignitionPerYear, expectedAnnualLoss: ignitionPerYear * ps.severity[0]! }
}

function captureDistance(ps: PreparedSite, current: number): number {
  const params = { strikingDistanceA: ps.strikeA, strikingDistanceB: ps.strikeB, groundStrikingFactor: ps.groundFactor }
  return isolatedCaptureRadius(ps.attachmentModel, current, ps.objHeight[0]!, ps.objRadius[0]!, params)
}

function directArea(ps: PreparedSite, current: number): number {
  const d = captureDistance(ps, current)
  return Math.PI * d * d
}

/** ∫_{D(I)}^{∞} 2πy·Psp(I, y) dy, in t = ln y, split at the class floors and 50 % distances. */
function sparkingArea(ps: PreparedSite, current: number, resolution: number): number {
  if (!canSpark(ps, 0, current)) return 0
  const lnI = Math.log(current)
  const d = captureDistance(ps, current)
  let far = -Infinity
  const breaks: number[] = []
  let sigmaMin = Infinity
  for (let c = ps.classStart[0]!; c < ps.classStart[1]!; c++) {
    const sigma = 1 / ps.classInvSigma[c]!
    const y50 = lnI + ps.classLogCoef[c]!
    breaks.push(y50, ps.classLogFloor[c]!)
    // Φ(−9) ≈ 1e-19: nothing beyond matters even multiplied by the area.
    far = Math.max(far, y50 + 9 * sigma, ps.classLogFloor[c]! + 1)
    if (sigma > 1e-9) sigmaMin = Math.min(sigmaMin, sigma)
  }
  const lnD = Math.log(Math.max(d, 1e-9))
  const width = Math.min(0.5, Number.isFinite(sigmaMin) ? sigmaMin / 1.5 : 0.5) / resolution
  return integrate((t) => 2 * Math.PI * Math.exp(2 * t) * exactSparkProbabilityLn(ps, 0, lnI, t), lnD, far, width, breaks)
}

type Inner = (current: number) => number

/** E over the truncated current law of an inner area; ln I for parametric laws, probability space for the empirical one. */
function integrateOverCurrent(ps: PreparedSite, a: AssumptionSet, tank: TankInput, inner: Inner, resolution: number): number {
  const law = ps.law
  const breaksKa = currentBreakpoints(a, tank)
  const mass = law.uHi - law.uLo
  const density = law.law.logDensity
  if (density) {
    const f = (s: number) => density(s) * inner(Math.exp(s))
    return integrate(f, Math.log(law.minKa), Math.log(law.maxKa), 0.1 / resolution, breaksKa.map(Math.log)) / mass
  }
  const breaks = [...empiricalNodes(a.empiricalCurrentsKa.length), ...breaksKa.map((i) => law.law.cdf(i))]
  return integrate((u) => inner(law.law.quantile(u)), law.uLo, law.uHi, 0.02 / resolution, breaks) / mass
}

/** Currents where an integrand has a kink or a jump: the shield rating, and where rg = H (EGM). */
function currentBreakpoints(a: AssumptionSet, tank: TankInput): number[] {
  const out: number[] = []
  if (tank.shieldRatingKa !== null && tank.shieldRatingKa > 0) out.push(tank.shieldRatingKa)
  if (a.attachmentModel === 'egm') out.push(Math.pow(tank.heightM / (a.groundStrikingFactor * a.strikingDistanceA), 1 / a.strikingDistanceB))
  return out.filter((i) => i > a.currentMinKa && i < a.currentMaxKa)
}

/** The empirical law's quantile function bends at j/(n−1); at most ~400 of those as panel edges. */
function empiricalNodes(n: number): number[] {
  const step = Math.max(1, Math.ceil((n - 1) / 400))
  const out: number[] = []
  for (let j = 0; j < n; j += step) out.push(j / (n - 1))
  return out
}
