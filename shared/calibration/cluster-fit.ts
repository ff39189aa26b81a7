// Storm clustering from lightning-location records (issue 21 point 4; docs/methodology.md "Storm
// clustering calibration"): a Thomas process fitted by minimum contrast on Ripley's K function.
//
// Thomas process (Thomas 1949; Illian et al. 2008 §6.3.2; Møller & Waagepetersen 2004 §5.3): storm
// centres form a Poisson process of intensity κ (per km² per window); each storm drops Poisson(μ)
// ground flashes, displaced from its centre by independent N(0, σ²) in each coordinate. Its K
// function is K(r) = πr² + (1 − exp(−r²/(4σ²)))/κ, free of μ; the flash intensity is λ = κμ.
//
// Estimation (Diggle & Gratton 1984; Diggle 2003 §6.3): the records are cut into time windows (UTC
// days by default), each window's flashes form one planar pattern in the same rectangle; K is
// estimated per window with the translation edge correction (Ohser & Stoyan 1981; Illian et al.
// 2008 §4.3.3) and pooled over the windows as the ratio of summed weighted pair counts to summed
// n(n − 1) (Baddeley, Moyeed, Howard & Boyde 1993); (κ, σ) minimise ∫ (K̂(r)^c − K(r)^c)² dr over
// 0 < r ≤ a quarter of the rectangle's shorter side, c = 0.25 (Diggle 2003 §6.3). μ = λ̂/κ̂ with λ̂ the
// flash count per window and km², divided by the detection efficiency. Intervals: parametric
// bootstrap (simulate the fitted process in the same rectangle and number of windows, refit,
// 2.5 % and 97.5 % percentiles; Davison & Hinkley 1997 §2.4).
import { createStream, poissonDraw, type UniformStream } from '../engine/random'
import { CalibrationInputError } from './errors'
import { EARTH_MEAN_RADIUS_KM } from './geo'
import { normalCdf } from '../engine/normal'

export interface PlanarPoint { x: number, y: number }
/** An axis-parallel rectangle [0, width] × [0, height] in km. */
export interface Rectangle { width: number, height: number }

/** The exponent of the contrast and the number of r values between 0 and r_max. */
export const MINIMUM_CONTRAST = { exponent: 0.25, radii: 50, rangeShareOfSide: 0.25 } as const
/**
 * Pair comparisons one fit may spend (Σ n² over the windows); beyond it every flash is kept with
 * one probability p, the same in every window, chosen to keep within it. Independent thinning leaves K unchanged (Illian et al. 2008 §4.3),
 * so only the sampling error grows; μ is taken from the full counts.
 */
export const PAIR_BUDGET = 3_000_000

/** The Thomas process's K function (Illian et al. 2008, eq. 6.3.9; Møller & Waagepetersen 2004, ex. 5.3). */
export function thomasK(r: number, kappa: number, sigma: number): number {
  return Math.PI * r * r + (1 - Math.exp(-(r * r) / (4 * sigma * sigma))) / kappa
}

/**
 * ∫∫ over W × W of the Thomas process's excess pair density per λ² times κ: for a rectangle
 * a × b, (∫₋ₐᵃ (a − |x|) φ(x) dx)(∫₋ᵦᵇ (b − |y|) φ(y) dy) with φ the N(0, 2σ²) density — the set
 * covariance of W integrated against the distribution of the difference of two flashes of one storm.
 * Each factor is 2[a(Φ(a/s) − ½) − s(1 − exp(−a²/2s²))/√(2π)], s = σ√2 (hand-integrated).
 */
export function siblingPairsInWindow(window: Rectangle, sigma: number): number {
  const s = sigma * Math.SQRT2
  const one = (a: number) => 2 * (a * (normalCdf(a / s) - 0.5) - (s * (1 - Math.exp(-(a * a) / (2 * s * s)))) / Math.sqrt(2 * Math.PI))
  return one(window.width) * one(window.height)
}

/**
 * What the ratio-pooled K̂ estimates under a Thomas process: E[Σ pairs] = λ²|W|K(r) while
 * E[n(n − 1)] = λ²(|W|² + I/κ), I = siblingPairsInWindow (the flashes' own clustering inflates the
 * count that estimates λ²), so K̂ → K(r) / (1 + I/(κ|W|²)). Negligible when a window holds many
 * storms; about 20 % when it holds four. Derived in docs/methodology.md.
 */
export function pooledThomasK(r: number, kappa: number, sigma: number, window: Rectangle): number {
  const area = window.width * window.height
  return thomasK(r, kappa, sigma) / (1 + siblingPairsInWindow(window, sigma) / (kappa * area * area))
}

/** r_k = r_max · k / M for k = 1…M. */
export function radiiGrid(rMax: number, count: number = MINIMUM_CONTRAST.radii): Float64Array {
  const r = new Float64Array(count)
  for (let k = 0; k < count; k++) r[k] = (rMax * (k + 1)) / count
  return r
}

/**
 * Σ over ordered pairs i ≠ j of the translation weight |W| / |W ∩ (W + x_i − x_j)| for d_ij ≤ r_k,
 * for a uniform grid of radii (cumulative). For a rectangle |W ∩ (W + h)| = (a − |h_x|)(b − |h_y|).
 */
export function translationPairSums(points: readonly PlanarPoint[], window: Rectangle, radii: Float64Array): Float64Array {
  const m = radii.length
  const rMax = radii[m - 1]!
  const step = rMax / m
  const area = window.width * window.height
  const bins = new Float64Array(m)
  const sorted = [...points].sort((p, q) => p.x - q.x)
  const n = sorted.length
  const xs = new Float64Array(n)
  const ys = new Float64Array(n)
  for (let i = 0; i < n; i++) { xs[i] = sorted[i]!.x; ys[i] = sorted[i]!.y }
  const r2 = rMax * rMax
  for (let i = 0; i < n; i++) {
    const xi = xs[i]!, yi = ys[i]!
    for (let j = i + 1; j < n; j++) {
      const dx = xs[j]! - xi
      if (dx > rMax) break
      const dy = ys[j]! - yi
      const d2 = dx * dx + dy * dy
      if (d2 > r2) continue
      const d = Math.sqrt(d2)
      // Bin k holds rₖ₋₁ < d ≤ rₖ; d = 0 (two records at one place) counts from the first radius.
      const k = Math.max(0, Math.ceil(d / step) - 1)
      const overlap = (window.width - Math.abs(dx)) * (window.height - Math.abs(dy))
      if (overlap <= 0) continue
      bins[Math.min(m - 1, k)]! += (2 * area) / overlap
    }
  }
  for (let k = 1; k < m; k++) bins[k]! += bins[k - 1]!
  return bins
}

/** Ripley's K of one pattern with the translation correction: |W| / (n(n − 1)) · Σ pairs (Illian et al. 2008 eq. 4.3.30 with λ² estimated by n(n − 1)/|W|²). */
export function kFunction(points: readonly PlanarPoint[], window: Rectangle, radii: Float64Array): Float64Array {
  const n = points.length
  const sums = translationPairSums(points, window, radii)
  const area = window.width * window.height
  const out = new Float64Array(radii.length)
  if (n < 2) return out.fill(Number.NaN)
  for (let k = 0; k < out.length; k++) out[k] = (area * sums[k]!) / (n * (n - 1))
  return out
}

/** K pooled over replicated patterns in one window: |W| Σᵢ pairsᵢ(r) / Σᵢ nᵢ(nᵢ − 1) (Baddeley et al. 1993, "ratio" pooling). */
export function pooledK(patterns: readonly (readonly PlanarPoint[])[], window: Rectangle, radii: Float64Array): { k: Float64Array, patterns: number } {
  const total = new Float64Array(radii.length)
  let weight = 0
  let used = 0
  for (const p of patterns) {
    if (p.length < 2) continue
    const sums = translationPairSums(p, window, radii)
    for (let k = 0; k < total.length; k++) total[k]! += sums[k]!
    weight += p.length * (p.length - 1)
    used++
  }
  const area = window.width * window.height
  const k = new Float64Array(radii.length)
  for (let i = 0; i < k.length; i++) k[i] = weight > 0 ? (area * total[i]!) / weight : Number.NaN
  return { k, patterns: used }
}

export interface ContrastFit { kappa: number, sigma: number, contrast: number }
export type ContrastResult = { fit: ContrastFit, problem: null } | { fit: null, problem: string }

/** x^c, with the usual c = ¼ as two square roots (several times faster than Math.pow). */
const power = (x: number, c: number) => (c === 0.25 ? Math.sqrt(Math.sqrt(x)) : x ** c)

/** D(κ, σ) = Σₖ (K̂(rₖ)^c − K(rₖ; κ, σ)^c)² on the uniform grid (∝ the integral), K as the pooled estimate expects it. */
export function contrast(kHat: Float64Array, radii: Float64Array, kappa: number, sigma: number, window: Rectangle, c: number = MINIMUM_CONTRAST.exponent): number {
  const area = window.width * window.height
  const deflate = 1 + siblingPairsInWindow(window, sigma) / (kappa * area * area)
  let s = 0
  for (let k = 0; k < radii.length; k++) {
    const e = kHat[k]!
    if (!Number.isFinite(e)) continue
    const d = power(Math.max(0, e), c) - power(thomasK(radii[k]!, kappa, sigma) / deflate, c)
    s += d * d
  }
  return s
}

/**
 * Minimum-contrast fit of (κ, σ): a log-spaced grid search, then Nelder–Mead (Nelder & Mead 1965)
 * on (log σ, log 1/κ) from the best grid point. A fit at the edge of the searched ranges is refused:
 * no clustering within r_max (1/κ at its floor) or storms wider than the r-range (σ at its ceiling).
 */
export function fitThomasMinimumContrast(kHat: Float64Array, radii: Float64Array, window: Rectangle): ContrastResult {
  const area = window.width * window.height
  const rMax = radii[radii.length - 1]!
  if (!kHat.some(Number.isFinite)) return { fit: null, problem: 'Too few flashes in any window to estimate K (at least two per window are needed).' }
  const sLo = Math.log(rMax / 500), sHi = Math.log(2 * rMax)
  const tLo = Math.log(area * 1e-7), tHi = Math.log(area * 100)
  const f = (s: number, t: number) => contrast(kHat, radii, Math.exp(-t), Math.exp(s), window)
  let best = { s: 0, t: 0, d: Infinity }
  const G = 60
  const m = radii.length
  const c = MINIMUM_CONTRAST.exponent
  // The grid with what depends on σ alone worked out once per σ: K(r) = πr² + g(r)/κ, g = 1 − exp(−r²/4σ²).
  const target = new Float64Array(m)
  const poisson = new Float64Array(m)
  const g = new Float64Array(m)
  for (let k = 0; k < m; k++) { target[k] = Number.isFinite(kHat[k]!) ? power(Math.max(0, kHat[k]!), c) : Number.NaN; poisson[k] = Math.PI * radii[k]! ** 2 }
  for (let i = 0; i <= G; i++) {
    const s = sLo + ((sHi - sLo) * i) / G
    const sigma = Math.exp(s)
    for (let k = 0; k < m; k++) g[k] = 1 - Math.exp(-(radii[k]! ** 2) / (4 * sigma * sigma))
    const sibling = siblingPairsInWindow(window, sigma) / (area * area)
    for (let j = 0; j <= G; j++) {
      const t = tLo + ((tHi - tLo) * j) / G
      const inverseKappa = Math.exp(t)
      const deflate = 1 + sibling * inverseKappa
      let d = 0
      for (let k = 0; k < m; k++) {
        if (Number.isNaN(target[k]!)) continue
        const e = target[k]! - power((poisson[k]! + g[k]! * inverseKappa) / deflate, c)
        d += e * e
      }
      if (d < best.d) best = { s, t, d }
    }
  }
  const clamp = (s: number, t: number): [number, number] => [Math.min(sHi, Math.max(sLo, s)), Math.min(tHi, Math.max(tLo, t))]
  const [s, t, d] = nelderMead((v) => { const [a, b] = clamp(v[0]!, v[1]!); return f(a, b) }, [best.s, best.t], [(sHi - sLo) / G, (tHi - tLo) / G])
  const [sc, tc] = clamp(s, t)
  const edge = 1e-3
  if (tc - tLo < edge * (tHi - tLo)) return { fit: null, problem: 'No clustering found: K does not rise above that of a Poisson pattern (πr²) within the r-range. The flashes of a window look independent.' }
  if (sHi - sc < edge * (sHi - sLo)) return { fit: null, problem: 'The storms look wider than the r-range (a quarter of the window\'s side): choose a larger region.' }
  if (sc - sLo < edge * (sHi - sLo)) return { fit: null, problem: 'The clusters look tighter than the smallest distance resolved: check whether the records are strokes that should be grouped into flashes.' }
  return { fit: { kappa: Math.exp(-tc), sigma: Math.exp(sc), contrast: d }, problem: null }
}

/** Nelder–Mead simplex minimisation (standard coefficients 1, 2, ½, ½). */
function nelderMead(f: (v: number[]) => number, start: number[], steps: number[], iterations = 400): [number, number, number] {
  const n = start.length
  let simplex = [start, ...start.map((_, i) => start.map((x, j) => (i === j ? x + steps[i]! : x)))].map(v => ({ v, f: f(v) }))
  for (let it = 0; it < iterations; it++) {
    simplex.sort((a, b) => a.f - b.f)
    const bestF = simplex[0]!.f, worst = simplex[n]!
    if (Math.abs(worst.f - bestF) <= 1e-14 * (Math.abs(bestF) + 1e-300)) break
    const centroid = start.map((_, j) => simplex.slice(0, n).reduce((a, p) => a + p.v[j]!, 0) / n)
    const at = (t: number) => centroid.map((c, j) => c + t * (worst.v[j]! - c))
    const reflected = at(-1)
    const fr = f(reflected)
    if (fr < bestF) {
      const expanded = at(-2)
      const fe = f(expanded)
      simplex[n] = fe < fr ? { v: expanded, f: fe } : { v: reflected, f: fr }
    } else if (fr < simplex[n - 1]!.f) {
      simplex[n] = { v: reflected, f: fr }
    } else {
      const contracted = at(0.5)
      const fc = f(contracted)
      if (fc < worst.f) simplex[n] = { v: contracted, f: fc }
      else simplex = simplex.map((p, i) => (i === 0 ? p : { v: p.v.map((x, j) => simplex[0]!.v[j]! + 0.5 * (x - simplex[0]!.v[j]!)), f: 0 })).map((p, i) => (i === 0 ? p : { v: p.v, f: f(p.v) }))
    }
  }
  simplex.sort((a, b) => a.f - b.f)
  return [simplex[0]!.v[0]!, simplex[0]!.v[1]!, simplex[0]!.f]
}

function gaussianPair(u: UniformStream): [number, number] {
  // Box–Muller (Box & Muller 1958).
  const r = Math.sqrt(-2 * Math.log(u()))
  const a = 2 * Math.PI * u()
  return [r * Math.cos(a), r * Math.sin(a)]
}

/**
 * One pattern of a Thomas process in the rectangle: storm centres Poisson(κ) in the rectangle
 * widened by 4σ on every side (so storms centred outside still drop flashes inside), Poisson(μ)
 * flashes each, N(0, σ²) displacement per coordinate; flashes outside the rectangle are dropped.
 */
export function simulateThomas(uniform: UniformStream, window: Rectangle, kappa: number, mu: number, sigma: number): PlanarPoint[] {
  const margin = 4 * sigma
  const w = window.width + 2 * margin, h = window.height + 2 * margin
  const storms = poissonDraw(kappa * w * h, uniform)
  const points: PlanarPoint[] = []
  for (let s = 0; s < storms; s++) {
    const cx = uniform() * w - margin, cy = uniform() * h - margin
    const n = poissonDraw(mu, uniform)
    for (let i = 0; i < n; i++) {
      const [dx, dy] = gaussianPair(uniform)
      const x = cx + sigma * dx, y = cy + sigma * dy
      if (x >= 0 && x <= window.width && y >= 0 && y <= window.height) points.push({ x, y })
    }
  }
  return points
}

/** A Poisson pattern of intensity λ in the rectangle. */
export function simulatePoisson(uniform: UniformStream, window: Rectangle, lambda: number): PlanarPoint[] {
  const n = poissonDraw(lambda * window.width * window.height, uniform)
  return Array.from({ length: n }, () => ({ x: uniform() * window.width, y: uniform() * window.height }))
}

// ---- from records to a fit ------------------------------------------------------------------------

export interface ClusterRecord { timeMs: number, latDeg: number, lonDeg: number }
export interface LatLonBox { minLat: number, maxLat: number, minLon: number, maxLon: number }

export interface ClusterFitOptions {
  box: LatLonBox
  /** Length of a time window (h); windows start at 00:00 UTC of 1970-01-01 and follow each other. */
  windowHours: number
  detectionEfficiency: number
  /** Years the records cover (storms per km² per year = flashes per km² per year / μ). */
  periodYears: number
  bootstrap: number
  seed: string
}

export interface BootstrapInterval { lo: number, hi: number, confidence: number }

export interface ClusterFitResult {
  method: string
  edgeCorrection: string
  window: { widthKm: number, heightKm: number, areaKm2: number, box: LatLonBox, hours: number }
  flashes: number
  /** keptShare: the share of flashes kept, at random, for the pair counts (1: all). */
  windows: { withFlashes: number, used: number, largest: number, keptShare: number }
  rMaxKm: number
  exponent: number
  /** κ in storms per km² per window (as the pooled K sees it), and per km² per year (flash density / μ). */
  kappaPerKm2PerWindow: number
  kappaPerKm2PerYear: number
  spreadKm: number
  flashesPerStorm: number
  /** Observed flashes per km² per window with flashes, before the detection-efficiency correction. */
  lambdaPerKm2PerWindow: number
  intervals: { spreadKm: BootstrapInterval, flashesPerStorm: BootstrapInterval, kappaPerKm2PerYear: BootstrapInterval } | null
  bootstrap: { requested: number, fitted: number, failed: number }
  /** K̂ and the fitted K at the radii, for the fit chart. */
  curve: { rKm: number[], kHat: number[], kFit: number[] }
}

/** Local equirectangular projection about the box's middle latitude (km); fine for boxes up to ~1,000 km. */
export function projectBox(box: LatLonBox): { window: Rectangle, project: (latDeg: number, lonDeg: number) => PlanarPoint } {
  const RAD = Math.PI / 180
  const cos = Math.cos(((box.minLat + box.maxLat) / 2) * RAD)
  const project = (latDeg: number, lonDeg: number) => ({ x: EARTH_MEAN_RADIUS_KM * (lonDeg - box.minLon) * RAD * cos, y: EARTH_MEAN_RADIUS_KM * (latDeg - box.minLat) * RAD })
  const corner = project(box.maxLat, box.maxLon)
  return { window: { width: corner.x, height: corner.y }, project }
}

/**
 * The one retention share p for every window with Σ (p·nᵢ)² ≤ budget (1 when within it). The same p
 * everywhere keeps the ratio pooling's weights (a per-window cap would weight windows equally and
 * bias κ towards the windows that happened to hold few storms).
 */
export function thinningShare(counts: readonly number[], budget: number = PAIR_BUDGET): number {
  const squares = counts.reduce((a, n) => a + n * n, 0)
  return squares <= budget ? 1 : Math.sqrt(budget / squares)
}

/** Independent thinning: each point kept with probability p. */
function thinned<T>(items: readonly T[], p: number, uniform: UniformStream): T[] {
  return p >= 1 ? [...items] : items.filter(() => uniform() < p)
}

function percentile(sorted: readonly number[], p: number): number {
  // Type 7 (linear between order statistics; Hyndman & Fan 1996).
  const h = (sorted.length - 1) * p
  const lo = Math.floor(h)
  return sorted[lo]! + (h - lo) * ((sorted[Math.min(sorted.length - 1, lo + 1)] ?? sorted[lo]!) - sorted[lo]!)
}

interface WindowFit { kappa: number, sigma: number, mu: number, kHat: Float64Array }

/** Σ n and Σ n(n − 1) over the windows, from the full (unthinned) counts. */
interface CountSums { n: number, pairs: number }

/**
 * Fits the (thinned) patterns. μ (observed, before the efficiency correction) from the counts:
 * Σ n(n − 1) = μ Σλ (κ|W|² + I) with Σλ = Σn/|W| (docs/methodology.md) — free of how many windows had
 * no flash, and of how the storm count varies from window to window when μ and σ do not.
 */
function fitPatterns(patterns: PlanarPoint[][], sums: CountSums, window: Rectangle, radii: Float64Array): { fit: WindowFit | null, problem: string | null } {
  const area = window.width * window.height
  const { k } = pooledK(patterns, window, radii)
  const result = fitThomasMinimumContrast(k, radii, window)
  if (!result.fit) return { fit: null, problem: result.problem }
  const { kappa, sigma } = result.fit
  const mu = sums.pairs / ((sums.n / area) * (kappa * area * area + siblingPairsInWindow(window, sigma)))
  return { fit: { kappa, sigma, mu, kHat: k }, problem: null }
}

/**
 * The whole calibration: window the records in time, project them, thin them to the pair budget, fit, and bootstrap. Windows with fewer than two flashes carry no pair and are left out
 * (they still count for κ per year only through the windows that had flashes).
 */
export function fitStormClustering(records: readonly ClusterRecord[], options: ClusterFitOptions): ClusterFitResult {
  const { window, project } = projectBox(options.box)
  if (!(window.width > 0 && window.height > 0)) throw new CalibrationInputError('The region has no extent: give a box with a south–north and a west–east span.')
  const windowMs = options.windowHours * 3600e3
  const byWindow = new Map<number, PlanarPoint[]>()
  for (const r of records) {
    if (r.latDeg < options.box.minLat || r.latDeg > options.box.maxLat || r.lonDeg < options.box.minLon || r.lonDeg > options.box.maxLon) continue
    const key = Math.floor(r.timeMs / windowMs)
    let list = byWindow.get(key)
    if (!list) byWindow.set(key, list = [])
    list.push(project(r.latDeg, r.lonDeg))
  }
  const keys = [...byWindow.keys()].sort((a, b) => a - b)
  const all = keys.map(k => byWindow.get(k)!)
  const flashes = all.reduce((a, p) => a + p.length, 0)
  const used = all.filter(p => p.length >= 2)
  if (used.length === 0) throw new CalibrationInputError('No time window holds two or more ground flashes inside the region: choose a larger region or longer windows.')
  const rMax = MINIMUM_CONTRAST.rangeShareOfSide * Math.min(window.width, window.height)
  const radii = radiiGrid(rMax)
  const counts = used.map(p => p.length)
  const share = thinningShare(counts)
  const thin = createStream(options.seed, 'storm-clustering', 'thinning')
  const patterns = used.map(p => thinned(p, share, thin))
  const windows = all.length
  const sums: CountSums = { n: flashes, pairs: counts.reduce((a, n) => a + n * (n - 1), 0) }
  const main = fitPatterns(patterns, sums, window, radii)
  if (!main.fit) throw new CalibrationInputError(main.problem!)
  const fit = main.fit
  const area = window.width * window.height
  const efficiency = options.detectionEfficiency
  // Storms per km² per year: flash density over flashes per storm (both before the efficiency correction).
  const perYear = (f: WindowFit, flashCount: number) => flashCount / (area * options.periodYears) / f.mu

  // Parametric bootstrap: the fitted process (observed μ, i.e. before the efficiency correction) in
  // the same rectangle, as many windows as had flashes, each thinned as its observed window was.
  const muObserved = fit.mu
  const sigmas: number[] = [], mus: number[] = [], kappas: number[] = []
  let failed = 0
  for (let b = 0; b < options.bootstrap; b++) {
    const u = createStream(options.seed, 'storm-clustering', `bootstrap ${b}`)
    const simPatterns: PlanarPoint[][] = []
    const simSums: CountSums = { n: 0, pairs: 0 }
    for (let i = 0; i < windows; i++) {
      // Independent thinning of a Thomas process is a Thomas process with μ·p (same κ, σ); the full
      // counts' sums are estimated without bias by n/p and n(n − 1)/p².
      const p = share
      const pts = simulateThomas(u, window, fit.kappa, muObserved * p, fit.sigma)
      simPatterns.push(pts)
      simSums.n += pts.length / p
      simSums.pairs += (pts.length * (pts.length - 1)) / (p * p)
    }
    const refit = fitPatterns(simPatterns, simSums, window, radii)
    if (!refit.fit) { failed++; continue }
    sigmas.push(refit.fit.sigma); mus.push(refit.fit.mu / efficiency); kappas.push(perYear(refit.fit, simSums.n))
  }
  const interval = (xs: number[]): BootstrapInterval => { const s = [...xs].sort((a, b) => a - b); return { lo: percentile(s, 0.025), hi: percentile(s, 0.975), confidence: 0.95 } }
  const enough = sigmas.length >= 19
  return {
    method: `Thomas process by minimum contrast on Ripley's K (Diggle & Gratton 1984; exponent c = ${MINIMUM_CONTRAST.exponent}, 0 < r ≤ ${rMax.toFixed(1)} km), pooled over ${used.length} windows of ${options.windowHours} h; parametric bootstrap, ${sigmas.length} refits`,
    edgeCorrection: 'translation (Ohser & Stoyan 1981)',
    window: { widthKm: window.width, heightKm: window.height, areaKm2: window.width * window.height, box: options.box, hours: options.windowHours },
    flashes,
    windows: { withFlashes: windows, used: used.length, largest: Math.max(...counts), keptShare: share },
    rMaxKm: rMax,
    exponent: MINIMUM_CONTRAST.exponent,
    kappaPerKm2PerWindow: fit.kappa,
    kappaPerKm2PerYear: perYear(fit, flashes),
    spreadKm: fit.sigma,
    flashesPerStorm: fit.mu / efficiency,
    lambdaPerKm2PerWindow: flashes / (windows * window.width * window.height),
    intervals: enough ? { spreadKm: interval(sigmas), flashesPerStorm: interval(mus), kappaPerKm2PerYear: interval(kappas) } : null,
    bootstrap: { requested: options.bootstrap, fitted: sigmas.length, failed },
    curve: { rKm: [...radii], kHat: [...fit.kHat], kFit: [...radii].map(r => pooledThomasK(r, fit.kappa, fit.sigma, window)) },
  }
}
