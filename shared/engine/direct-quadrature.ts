// Direct-strike frequency of one tank of a site by deterministic quadrature (no random numbers):
// f_direct = Ng·1e-6 · ∫₀¹ ∫₀^{D(I(u))} 2πr · q(I(u), r) dr du, where u is the probability of the
// truncated current law, D(I) the tank's isolated capture distance and q(I, r) the exact share of
// directions at distance r in which the tank wins the attachment against the whole site
// (`directCaptureFraction`). Both integrals are adaptive Gauss–Kronrod (7/15 points, QUADPACK's QAG
// scheme); the reported error is the sum of the panels' |K15 − G7| estimates, inner errors included.
import type { ArcScratch, PreparedSite } from './kernel'
import { createArcScratch, directCaptureFraction, strikeRadius } from './kernel'

/** Kronrod nodes on [−1, 1] (non-negative half) and weights; Gauss weights for the odd nodes (Piessens et al., QUADPACK 1983, qk15). */
/* eslint-disable no-loss-of-precision -- QUADPACK's constants as published (33 digits); the parser rounds them to the nearest double */
const XGK = [0.991455371120812639206854697526329, 0.949107912342758524526189684047851, 0.864864423359769072789712788640926,
  0.741531185599394439863864773280788, 0.586087235467691130294144845693013, 0.405845151377397166906606412076961,
  0.207784955007898467600689403773245, 0]
const WGK = [0.022935322010529224963732008058970, 0.063092092629978553290700663189204, 0.104790010322250183839876322541518,
  0.140653259715525918745189590510238, 0.169004726639267902826583426598550, 0.190350578064785409913256402421014,
  0.204432940075298892414161999234649, 0.209482141084727828012999174891714]
/** Gauss 7-point weights for XGK[1], XGK[3], XGK[5], XGK[7]. */
const WG = [0.129484966168869693270611432679082, 0.279705391489276667901467771423780, 0.381830050505118944950369775488975,
  0.417959183673469387755102040816327]
/* eslint-enable no-loss-of-precision */

export interface DirectQuadratureOptions {
  /** Stop refining once the error estimate is below this share of the figure (default 1e-3). */
  relativeTolerance?: number
  /** … or below this many strikes per year (default 1e-10 /yr). */
  absoluteTolerancePerYear?: number
  /** Panels of the outer (current) integral before giving up refining (default 400). */
  maxPanels?: number
  /** Relative tolerance of the inner (distance) integrals (default: a tenth of the outer one). */
  innerRelativeTolerance?: number
}

export interface DirectQuadratureResult {
  /** Direct strikes per year on the tank. */
  ratePerYear: number
  /** Estimated quadrature error of that rate, per year (an error bound in practice, far above the true error). */
  errorPerYear: number
  /** Capture-share evaluations used (for the benchmark). */
  evaluations: number
}

/** Integrand that may add the error of its own value (an inner integral) to `err.value`. */
type Integrand = (x: number, err: { value: number }) => number

interface Panel { a: number; b: number; value: number; error: number }

function gk15(f: Integrand, a: number, b: number): Panel {
  const centre = 0.5 * (a + b)
  const half = 0.5 * (b - a)
  const inner = { value: 0 }
  const fc = f(centre, inner)
  let kronrod = fc * WGK[7]!
  let gauss = fc * WG[3]!
  let innerError = inner.value * WGK[7]!
  for (let j = 0; j < 7; j++) {
    const dx = half * XGK[j]!
    inner.value = 0
    const f1 = f(centre - dx, inner)
    const e1 = inner.value
    inner.value = 0
    const f2 = f(centre + dx, inner)
    const e2 = inner.value
    kronrod += WGK[j]! * (f1 + f2)
    innerError += WGK[j]! * (e1 + e2)
    if (j % 2 === 1) gauss += WG[(j - 1) / 2]! * (f1 + f2)
  }
  return { a, b, value: kronrod * half, error: Math.abs((kronrod - gauss) * half) + innerError * half }
}

/** Adaptive G7–K15 over the panels between `edges`: bisect the worst panel until the total error meets the tolerance. */
function adaptiveIntegral(f: Integrand, edges: readonly number[], relTol: number, absTol: number, maxPanels: number): { value: number; error: number } {
  const panels: Panel[] = []
  for (let i = 0; i + 1 < edges.length; i++) if (edges[i + 1]! > edges[i]!) panels.push(gk15(f, edges[i]!, edges[i + 1]!))
  for (;;) {
    let value = 0
    let error = 0
    let worst = -1
    for (let i = 0; i < panels.length; i++) {
      value += panels[i]!.value
      error += panels[i]!.error
      if (worst < 0 || panels[i]!.error > panels[worst]!.error) worst = i
    }
    if (worst < 0) return { value: 0, error: 0 }
    if (error <= Math.max(absTol, relTol * Math.abs(value)) || panels.length >= maxPanels) return { value, error }
    const p = panels[worst]!
    const mid = 0.5 * (p.a + p.b)
    if (!(mid > p.a && mid < p.b)) return { value, error }
    panels[worst] = gk15(f, p.a, mid)
    panels.push(gk15(f, mid, p.b))
  }
}

/** Isolated capture distance of tank t at striking distance rs: outside it nothing strikes t. */
export function isolatedDirectRadius(ps: PreparedSite, t: number, rs: number): number {
  if (ps.attachmentModel === 'collection_area') return ps.objRadius[t]! + 3 * ps.objHeight[t]!
  const rg = ps.groundFactor * rs
  const h = ps.objHeight[t]!
  const gap = rg - h
  return h >= rg ? ps.objRadius[t]! + rs : gap >= rs ? 0 : ps.objRadius[t]! + Math.sqrt(rs * rs - gap * gap)
}

/**
 * Direct strikes per year on tank t, deterministic. `uEdges` (probability edges of the current
 * law, e.g. the frequency-mode strata) seed the outer panels so narrow current windows are seen.
 */
export function directStrikeQuadrature(ps: PreparedSite, t: number, uEdges: ArrayLike<number>, options: DirectQuadratureOptions = {}): DirectQuadratureResult {
  const scale = ps.flashDensity * 1e-6
  if (!(scale > 0)) return { ratePerYear: 0, errorPerYear: 0, evaluations: 0 }
  const relTol = options.relativeTolerance ?? 1e-3
  const absTol = (options.absoluteTolerancePerYear ?? 1e-10) / scale
  const maxPanels = options.maxPanels ?? 400
  const innerRelTol = options.innerRelativeTolerance ?? relTol / 10
  const arcs: ArcScratch = createArcScratch(ps)
  const at = ps.objRadius[t]!
  let evaluations = 0
  // Inner integral in s = r² (equal areas): ∫ 2πr q dr = π ∫ q(√s) ds, with a panel edge at the
  // tank's own radius (inside it the capture height stops changing with r).
  // An inner integral only has to be good relative to the whole figure (the outer weights sum to 1),
  // not to its own value, which falls to 0 where a taller neighbour takes over: the inner absolute
  // tolerance is a share of the figure, from a coarse first pass.
  let innerAbs = 0
  const areaShare = (lnI: number, err: { value: number }, innerRel: number): number => {
    const rs = strikeRadius(ps, lnI)
    const d = isolatedDirectRadius(ps, t, rs)
    if (!(d > 0)) return 0
    const d2 = d * d
    const edges = at > 0 && at < d ? [0, at * at, d2] : [0, d2]
    const share = (s: number): number => { evaluations++; return directCaptureFraction(ps, t, rs, Math.sqrt(s), arcs) }
    const inner = adaptiveIntegral(share, edges, innerRel, Math.max(1e-9 * d2, innerAbs / Math.PI), 100)
    err.value += Math.PI * inner.error
    return Math.PI * inner.value
  }
  const edges = Array.from(uEdges)
  const coarse = adaptiveIntegral((u, err) => areaShare(ps.law.logQuantile(u), err, 1e-3), edges, 1e-2, absTol, 100)
  innerAbs = innerRelTol * Math.abs(coarse.value)
  const outer: Integrand = (u, err) => areaShare(ps.law.logQuantile(u), err, innerRelTol)
  const { value, error } = adaptiveIntegral(outer, edges, relTol, absTol, maxPanels)
  return { ratePerYear: scale * value, errorPerYear: scale * error, evaluations }
}
