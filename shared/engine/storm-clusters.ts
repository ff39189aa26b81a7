// Storm clustering in simulated years (issue 21; docs/methodology.md, "Storms that hit several sites").
//
// Flashes arrive as a Thomas cluster process: storm centres form a homogeneous Poisson process in the
// plane and in time of intensity κ = λmax/μ per km² per year (μ the mean ground flashes per storm,
// λmax ≥ every site's Ng); each storm drops Poisson(μ) flashes around its centre with a circular
// Gaussian spread σ, truncated at REACH_SIGMAS·σ and renormalised (so no mass is lost); a flash at
// x is kept with probability Ng(x)/λmax. The flash intensity at every site is then exactly its own
// Ng — clustering correlates sites, it does not change any site's long-run rate.
//
// Given the storms, the site's flashes near its tanks in year y are Poisson with intensity
// Ng·Λ_y, Λ_y = Σ_{storms c in y} (μ/λmax)·k(site − c) (k the truncated Gaussian density per km²,
// taken at the site's centre: the site's reach, a few hundred metres, is small against σ), and
// E[Λ_y] = κ·(μ/λmax)·∫k = 1. So a site's candidate flashes (envelope.ts) are, storm by storm,
// Poisson(rate·(μ/λmax)·k(site − c)), independent between storms and between sites.
//
// Storms are not stored: storm j of spatial tile (tx, ty) and year block b is a pure function of
// (run seed, tx, ty, b, j) through a counter-based hash, and the storm count of each tile-block is a
// Poisson draw from the same hash. Any worker regenerates exactly the storms that reach its sites,
// so results do not depend on chunking. A site draws its candidates by thinning: proposals pick a
// tile-block with probability ∝ (its storm count) × (the kernel's largest value over the tile), a
// storm uniformly in it, and keep it with k(site − c)/kmax_tile — exact, and the cost grows with
// the site's candidates, not with the number of storms around it.
import type { StormClustering } from './assumptions'
import type { UniformStream } from './random'
import { createStream } from './random'

/** The kernel is cut at this many σ and renormalised (1 − e^(−8) ≈ 0.99966 of the Gaussian's mass lies inside). */
export const REACH_SIGMAS = 4
/** Spatial tiles of side σ/2 (a tight bound for the thinning), year blocks of 1,000 years. */
export const TILE_SIGMAS = 0.5
export const YEAR_BLOCK = 1000

/** What one site needs to draw its clustered candidates: its place in the run's plane and the run's λmax. */
export interface SiteClustering {
  /** Site centre in the run's plane (km east / north of the run's reference point). */
  xKm: number
  yKm: number
  /** λmax (flashes/km²/yr): the same for every site of the run (the largest Ng of the portfolio), ≥ this site's Ng. */
  maxFlashDensity: number
  spreadKm: number
  flashesPerStorm: number
}

/** The run-level frame: every site's position is projected about the same reference point. */
export interface ClusteringFrame { referenceLatitudeDeg: number; referenceLongitudeDeg: number; maxFlashDensity: number }

const EARTH_RADIUS_KM = 6371.0088 // mean Earth radius (IUGG)

/**
 * Equirectangular projection about the run's reference point (east = Δlon·cos(lat0), north = Δlat),
 * in km; good to well under 1 % of distance for the tens of kilometres over which storms correlate
 * sites within a few hundred kilometres of the reference (Snyder 1987, "Map Projections — A Working Manual").
 */
export function projectKm(frame: Pick<ClusteringFrame, 'referenceLatitudeDeg' | 'referenceLongitudeDeg'>, latitudeDeg: number, longitudeDeg: number): { xKm: number; yKm: number } {
  const rad = Math.PI / 180
  let dLon = longitudeDeg - frame.referenceLongitudeDeg
  if (dLon > 180) dLon -= 360
  if (dLon < -180) dLon += 360
  return { xKm: EARTH_RADIUS_KM * dLon * rad * Math.cos(frame.referenceLatitudeDeg * rad), yKm: EARTH_RADIUS_KM * (latitudeDeg - frame.referenceLatitudeDeg) * rad }
}

/** The run's frame from its sites: centre of their latitude/longitude span and the largest Ng. */
export function clusteringFrame(sites: readonly { latitudeDeg: number; longitudeDeg: number; flashDensity: number }[]): ClusteringFrame {
  if (sites.length === 0) throw new RangeError('a clustering frame needs at least one site')
  let latLo = Infinity, latHi = -Infinity, lonLo = Infinity, lonHi = -Infinity, ng = 0
  for (const s of sites) {
    latLo = Math.min(latLo, s.latitudeDeg); latHi = Math.max(latHi, s.latitudeDeg)
    lonLo = Math.min(lonLo, s.longitudeDeg); lonHi = Math.max(lonHi, s.longitudeDeg)
    ng = Math.max(ng, s.flashDensity)
  }
  return { referenceLatitudeDeg: (latLo + latHi) / 2, referenceLongitudeDeg: (lonLo + lonHi) / 2, maxFlashDensity: ng }
}

export function siteClustering(frame: ClusteringFrame, params: StormClustering, latitudeDeg: number, longitudeDeg: number): SiteClustering {
  return { ...projectKm(frame, latitudeDeg, longitudeDeg), maxFlashDensity: frame.maxFlashDensity, spreadKm: params.spreadKm, flashesPerStorm: params.flashesPerStorm }
}

// ── counter-based randomness ────────────────────────────────────────────────────────────────────

/** A 32-bit integer finaliser (the "triple32"-style xorshift-multiply mixer, Wellons 2018, "Prospecting for hash functions"). */
function mix(h: number): number {
  h ^= h >>> 16
  h = Math.imul(h, 0x21f0aaad)
  h ^= h >>> 15
  h = Math.imul(h, 0x735a2d97)
  h ^= h >>> 15
  return h >>> 0
}

function keyOf(seed: number, tx: number, ty: number, block: number, j: number): number {
  let h = mix(seed ^ 0x9e3779b9)
  h = mix(h ^ (tx | 0))
  h = mix((h + 0x7f4a7c15) ^ (ty | 0))
  h = mix((h + 0x94d049bb) ^ block)
  return mix((h + 0x2545f491) ^ j)
}

/** The k-th uniform on (0, 1) of a key (counter-based: Salmon et al. 2011, "Parallel random numbers: as easy as 1, 2, 3"). */
function uniformOf(key: number, k: number): number {
  // Two mixed words give 53 bits, as Math.random's doubles.
  const hi = mix(key ^ Math.imul(k * 2 + 1, 0x85ebca6b)) >>> 5
  const lo = mix((key + 0x165667b1) ^ Math.imul(k * 2 + 2, 0xc2b2ae35)) >>> 6
  return (hi * 67108864 + lo + 0.5) / 9007199254740992
}

/** The run's storm seed (a 32-bit integer) from the run seed. */
export function stormSeed(runSeed: number | string): number {
  return Math.floor(createStream(runSeed, 'storms', 'seed')() * 4294967296) >>> 0
}

/** Storm count of one tile-block: Poisson(κ·T²·B), from the tile-block's own counter stream. */
function stormCount(seed: number, tx: number, ty: number, block: number, mean: number): number {
  const key = keyOf(seed, tx, ty, block, 0x7fffffff)
  let k = 0
  return poissonLarge(mean, () => uniformOf(key, k++))
}

/** Storm j of a tile-block: its centre (km) and year. */
function stormAt(seed: number, tx: number, ty: number, block: number, j: number, tile: number, out: { x: number; y: number; year: number }): void {
  const key = keyOf(seed, tx, ty, block, j)
  out.x = (tx + uniformOf(key, 0)) * tile
  out.y = (ty + uniformOf(key, 1)) * tile
  out.year = block * YEAR_BLOCK + Math.min(YEAR_BLOCK - 1, Math.floor(uniformOf(key, 2) * YEAR_BLOCK))
}

// ── Poisson draws for large means ───────────────────────────────────────────────────────────────

const STIRLING = [8.333333333333333e-2, -2.777777777777778e-3, 7.936507936507937e-4, -5.952380952380952e-4, 8.417508417508418e-4, -1.917526917526918e-3, 6.41025641025641e-3, -2.955065359477124e-2, 1.796443723688307e-1, -1.3924322169059]

/** ln Γ(x) for x > 0 by the Stirling series after shifting x above 7 (Abramowitz & Stegun 6.1.40). */
export function logGamma(x: number): number {
  if (x === 1 || x === 2) return 0
  let x0 = x
  let n = 0
  if (x < 7) { n = Math.floor(7 - x); x0 = x + n }
  const x2 = 1 / (x0 * x0)
  let series = STIRLING[9]!
  for (let k = 8; k >= 0; k--) series = series * x2 + STIRLING[k]!
  let gl = series / x0 + 0.5 * Math.log(2 * Math.PI) + (x0 - 0.5) * Math.log(x0) - x0
  for (let k = 0; k < n; k++) { x0 -= 1; gl -= Math.log(x0) }
  return gl
}

/**
 * Poisson(mean) in constant expected time: inversion below 10, above it Hörmann's transformed
 * rejection with squeeze, PTRS (Hörmann 1993, "The transformed rejection method for generating
 * Poisson random variables", Insurance: Mathematics and Economics 12, 39–45).
 */
export function poissonLarge(mean: number, uniform: UniformStream): number {
  if (mean <= 0) return 0
  if (mean < 10) {
    const u = uniform()
    let k = 0
    let p = Math.exp(-mean)
    let cumulative = p
    while (u > cumulative && k < 1000) { k += 1; p *= mean / k; cumulative += p }
    return k
  }
  const slam = Math.sqrt(mean)
  const loglam = Math.log(mean)
  const b = 0.931 + 2.53 * slam
  const a = -0.059 + 0.02483 * b
  const invAlpha = 1.1239 + 1.1328 / (b - 3.4)
  const vr = 0.9277 - 3.6224 / (b - 2)
  for (;;) {
    const u = uniform() - 0.5
    const v = uniform()
    const us = 0.5 - Math.abs(u)
    const k = Math.floor((2 * a / us + b) * u + mean + 0.43)
    if (us >= 0.07 && v <= vr) return k
    if (k < 0 || (us < 0.013 && v > us)) continue
    if (Math.log(v) + Math.log(invAlpha) - Math.log(a / (us * us) + b) <= -mean + k * loglam - logGamma(k + 1)) return k
  }
}

// ── the kernel ──────────────────────────────────────────────────────────────────────────────────

/** Mass of the circular Gaussian inside the reach: 1 − exp(−R²/(2σ²)). */
export const KERNEL_MASS = 1 - Math.exp(-REACH_SIGMAS * REACH_SIGMAS / 2)

/** k(r): the truncated, renormalised Gaussian storm kernel (per km²) at distance r km. */
export function stormKernel(rKm: number, spreadKm: number): number {
  if (rKm >= REACH_SIGMAS * spreadKm) return 0
  return Math.exp(-rKm * rKm / (2 * spreadKm * spreadKm)) / (2 * Math.PI * spreadKm * spreadKm * KERNEL_MASS)
}

/** Storm centres per km² per year, κ = λmax/μ. */
export function stormIntensity(c: Pick<SiteClustering, 'maxFlashDensity' | 'flashesPerStorm'>): number {
  return c.maxFlashDensity / c.flashesPerStorm
}

/** The storm field's layout for a run: its seed, the spread, the kernel's reach, the tile side and the mean storms per tile-block. */
function stormField(c: Pick<SiteClustering, 'maxFlashDensity' | 'spreadKm' | 'flashesPerStorm'>, runSeed: number | string) {
  const sigma = c.spreadKm
  const tile = TILE_SIGMAS * sigma
  return { seed: stormSeed(runSeed), sigma, reach: REACH_SIGMAS * sigma, tile, perTileBlock: stormIntensity(c) * tile * tile * YEAR_BLOCK }
}

/**
 * Variance of a site's year factor Λ_y (E[Λ_y] = 1): (μ/λmax)·∫k² with ∫k² = (1 − e^(−R²/σ²)) /
 * (4πσ²·mass²) for the truncated kernel (Campbell's theorem for the shot noise Σ f(c)).
 */
export function yearFactorVariance(c: Pick<SiteClustering, 'maxFlashDensity' | 'flashesPerStorm' | 'spreadKm'>): number {
  const s2 = c.spreadKm * c.spreadKm
  const kk = (1 - Math.exp(-REACH_SIGMAS * REACH_SIGMAS)) / (4 * Math.PI * s2 * KERNEL_MASS * KERNEL_MASS)
  return (c.flashesPerStorm / c.maxFlashDensity) * kk
}

function checkClustering(c: SiteClustering): void {
  if (!(c.spreadKm > 0) || !(c.flashesPerStorm > 0)) throw new RangeError('storm clustering needs a spread σ above 0 km and flashes per storm above 0')
  if (!(c.maxFlashDensity > 0) || !Number.isFinite(c.maxFlashDensity)) throw new RangeError('storm clustering needs a largest flash density λmax above 0 flashes/km²/yr')
  if (!Number.isFinite(c.xKm) || !Number.isFinite(c.yKm)) throw new RangeError('storm clustering needs the site\'s position')
}

// ── a site's candidate years ────────────────────────────────────────────────────────────────────

/**
 * The years of a site's candidate flashes over `years` simulated years with storm clustering, for
 * an envelope of `ratePerYear` candidates per year (in draw order, not sorted). Storms come from the
 * run's counter-based storm field (the same for every site of the run); the proposals and the
 * thinning use the site's own stream `rand`.
 */
export function clusteredCandidateYears(c: SiteClustering, ratePerYear: number, years: number, runSeed: number | string, rand: UniformStream): Int32Array {
  checkClustering(c)
  if (ratePerYear <= 0) return new Int32Array(0)
  const { seed, sigma, reach, tile, perTileBlock } = stormField(c, runSeed)
  const blocks = Math.ceil(years / YEAR_BLOCK)
  const peak = 1 / (2 * Math.PI * sigma * sigma * KERNEL_MASS)
  const tx0 = Math.floor((c.xKm - reach) / tile), tx1 = Math.floor((c.xKm + reach) / tile)
  const ty0 = Math.floor((c.yKm - reach) / tile), ty1 = Math.floor((c.yKm + reach) / tile)
  // Tile-blocks within reach, with their storm counts and thinning bounds (cumulative weights).
  const nTiles = (tx1 - tx0 + 1) * (ty1 - ty0 + 1)
  const entryTx = new Int32Array(nTiles * blocks), entryTy = new Int32Array(nTiles * blocks), entryBlock = new Int32Array(nTiles * blocks)
  const entryCount = new Int32Array(nTiles * blocks), entryMinD2 = new Float64Array(nTiles * blocks), cumulative = new Float64Array(nTiles * blocks)
  let n = 0
  let total = 0
  for (let tx = tx0; tx <= tx1; tx++) {
    const dx = Math.max(tx * tile - c.xKm, 0, c.xKm - (tx + 1) * tile)
    for (let ty = ty0; ty <= ty1; ty++) {
      const dy = Math.max(ty * tile - c.yKm, 0, c.yKm - (ty + 1) * tile)
      const d2 = dx * dx + dy * dy
      if (d2 >= reach * reach) continue
      const bound = peak * Math.exp(-d2 / (2 * sigma * sigma))
      for (let b = 0; b < blocks; b++) {
        const count = stormCount(seed, tx, ty, b, perTileBlock)
        if (count === 0) continue
        entryTx[n] = tx; entryTy[n] = ty; entryBlock[n] = b; entryCount[n] = count; entryMinD2[n] = d2
        total += count * bound
        cumulative[n] = total
        n += 1
      }
    }
  }
  // Each storm gets Poisson(rate·(μ/λmax)·bound) proposals, kept with k/bound.
  const proposals = poissonLarge(ratePerYear * (c.flashesPerStorm / c.maxFlashDensity) * total, rand)
  let out = new Int32Array(Math.max(16, Math.ceil(ratePerYear * years * 1.2)))
  let kept = 0
  const storm = { x: 0, y: 0, year: 0 }
  const twoS2 = 2 * sigma * sigma
  for (let p = 0; p < proposals; p++) {
    const target = rand() * total
    let lo = 0, hi = n - 1
    while (lo < hi) {
      const mid = (lo + hi) >>> 1
      if (cumulative[mid]! <= target) lo = mid + 1
      else hi = mid
    }
    const j = Math.min(entryCount[lo]! - 1, Math.floor(rand() * entryCount[lo]!))
    stormAt(seed, entryTx[lo]!, entryTy[lo]!, entryBlock[lo]!, j, tile, storm)
    const u = rand()
    if (storm.year >= years) continue
    const ddx = storm.x - c.xKm, ddy = storm.y - c.yKm
    const r2 = ddx * ddx + ddy * ddy
    if (r2 >= reach * reach) continue
    if (u >= Math.exp((entryMinD2[lo]! - r2) / twoS2)) continue
    if (kept === out.length) { const grown = new Int32Array(out.length * 2); grown.set(out); out = grown }
    out[kept++] = storm.year
  }
  return out.slice(0, kept)
}

// ── storm flashes (records simulated by the same process) ───────────────────────────────────────

export interface StormFlash { xKm: number; yKm: number; year: number; storm: number }

/**
 * Every ground flash of the run's storm field that falls in the window [x0, x1] × [y0, y1] (km) in
 * the given year, each storm dropping Poisson(μ) flashes with the truncated Gaussian spread and each
 * flash kept with Ng(x)/λmax (`ngAt`, default λmax everywhere: none thinned). The same storms as the
 * sites' candidates; the flashes' own draws come from a stream of the year. For tests and for
 * simulated lightning-location records.
 */
export function stormFlashes(c: Pick<SiteClustering, 'maxFlashDensity' | 'spreadKm' | 'flashesPerStorm'>, runSeed: number | string, window: { x0: number; x1: number; y0: number; y1: number }, year: number, ngAt?: (xKm: number, yKm: number) => number): StormFlash[] {
  const { seed, sigma, reach, tile, perTileBlock } = stormField(c, runSeed)
  const block = Math.floor(year / YEAR_BLOCK)
  const rand = createStream(runSeed, 'storm-flashes', String(year))
  const flashes: StormFlash[] = []
  const storm = { x: 0, y: 0, year: 0 }
  let stormIndex = 0
  for (let tx = Math.floor((window.x0 - reach) / tile); tx <= Math.floor((window.x1 + reach) / tile); tx++) {
    for (let ty = Math.floor((window.y0 - reach) / tile); ty <= Math.floor((window.y1 + reach) / tile); ty++) {
      const count = stormCount(seed, tx, ty, block, perTileBlock)
      for (let j = 0; j < count; j++) {
        stormAt(seed, tx, ty, block, j, tile, storm)
        if (storm.year !== year) continue
        stormIndex += 1
        const drops = poissonLarge(c.flashesPerStorm, rand)
        for (let f = 0; f < drops; f++) {
          let dx: number, dy: number
          do {
            const r = sigma * Math.sqrt(-2 * Math.log(rand()))
            const theta = 2 * Math.PI * rand()
            dx = r * Math.cos(theta); dy = r * Math.sin(theta)
          } while (dx * dx + dy * dy >= reach * reach)
          const x = storm.x + dx, y = storm.y + dy
          const keep = ngAt ? ngAt(x, y) / c.maxFlashDensity : 1
          if (keep < 1 && rand() >= keep) continue
          if (x < window.x0 || x >= window.x1 || y < window.y0 || y >= window.y1) continue
          flashes.push({ xKm: x, yKm: y, year, storm: stormIndex })
        }
      }
    }
  }
  return flashes
}

// ── the portfolio without the shared storms ─────────────────────────────────────────────────────

/**
 * "Sites independent": a site's event years sent through a random permutation of the simulated
 * years of its own (seeded by run and site). Each site keeps its year-loss table exactly — the same
 * losses in the same years' groups, only relabelled — while the shared year index no longer lines up
 * storms across sites, so a portfolio added up from these years is the portfolio of independent
 * sites with the same marginals. Only the event years' images are drawn (a sparse Fisher–Yates
 * shuffle, Durstenfeld 1964): a uniformly random injection of the distinct event years into the years.
 */
export function sitesIndependentYears(eventYear: ArrayLike<number>, years: number, runSeed: number | string, siteId: string): Int32Array {
  const distinct = [...new Set(Array.from(eventYear))].sort((a, b) => a - b)
  if (distinct.length > years) throw new RangeError('more distinct event years than simulated years')
  const rand = createStream(runSeed, siteId, 'sites-independent')
  const swapped = new Map<number, number>()
  const image = new Map<number, number>()
  for (let i = 0; i < distinct.length; i++) {
    const j = i + Math.min(years - i - 1, Math.floor(rand() * (years - i)))
    const atJ = swapped.get(j) ?? j
    swapped.set(j, swapped.get(i) ?? i)
    image.set(distinct[i]!, atJ)
  }
  return Int32Array.from(eventYear, (y) => image.get(y)!)
}
