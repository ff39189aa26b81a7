// Storm clustering in simulated years (issue 21; docs/methodology.md "Storms that hit several sites"):
// the Thomas process's closed forms, the marginals it must keep, and its independence from chunking.
import { describe, expect, it } from 'vitest'
import {
  clusteredCandidateYears, createStream, isolatedTankQuadrature, KERNEL_MASS, parseAssumptions, REACH_SIGMAS, simulateSiteFrequency,
  simulateSiteYears, stormFlashes, stormKernel, yearFactorVariance,
} from '../../../shared/engine/index'
import type { SiteClustering } from '../../../shared/engine/index'
import { logGamma, poissonLarge } from '../../../shared/engine/storm-clusters'
import { makeSite, makeTank } from './fixtures'

const meanVar = (xs: ArrayLike<number>) => {
  let m = 0
  for (let i = 0; i < xs.length; i++) m += xs[i]!
  m /= xs.length
  let v = 0
  for (let i = 0; i < xs.length; i++) v += (xs[i]! - m) ** 2
  return { m, v: v / (xs.length - 1) }
}

describe('Poisson draws for large means (Hörmann 1993, PTRS)', () => {
  it('ln Γ matches exact factorials (ln 10! = 15.104412573075516, Abramowitz & Stegun table 6.1) and Γ(1/2) = √π', () => {
    expect(logGamma(11)).toBeCloseTo(15.104412573075516, 12)
    expect(logGamma(0.5)).toBeCloseTo(0.5 * Math.log(Math.PI), 12)
    expect(logGamma(101)).toBeCloseTo(363.73937555556347, 9) // ln 100!, exact value
  })
  it('mean and variance equal the Poisson mean, for means from 12 to 5,000', () => {
    for (const mean of [12, 250, 5000]) {
      const rand = createStream(3, 'poisson', String(mean))
      const n = 40_000
      const draws = Float64Array.from({ length: n }, () => poissonLarge(mean, rand))
      const { m, v } = meanVar(draws)
      // Sample mean: SE √(mean/n); sample variance: SE ≈ mean·√(2/n) (Poisson: variance = mean). 4 SE.
      expect(Math.abs(m - mean)).toBeLessThan(4 * Math.sqrt(mean / n))
      expect(Math.abs(v - mean)).toBeLessThan(4 * mean * Math.sqrt(2 / n) + 4 * Math.sqrt(mean / n))
    }
  })
})

describe('the storm kernel', () => {
  it('integrates to 1 over its reach (midpoint rule in r)', () => {
    const sigma = 3
    const steps = 20_000
    const R = REACH_SIGMAS * sigma
    let total = 0
    for (let i = 0; i < steps; i++) { const r = (i + 0.5) * R / steps; total += stormKernel(r, sigma) * 2 * Math.PI * r * R / steps }
    expect(total).toBeCloseTo(1, 6)
    expect(KERNEL_MASS).toBeCloseTo(1 - Math.exp(-8), 15)
  })
})

/** h(d) = ∫ k(c) k(c − d) dc for the truncated kernel, by the midpoint rule on a fine grid (a brute-force reference). */
function kernelOverlap(d: number, sigma: number): number {
  const R = REACH_SIGMAS * sigma
  const n = 500
  const h = (2 * R) / n
  let total = 0
  for (let i = 0; i < n; i++) {
    const x = -R + (i + 0.5) * h
    for (let j = 0; j < n; j++) {
      const y = -R + (j + 0.5) * h
      total += stormKernel(Math.hypot(x, y), sigma) * stormKernel(Math.hypot(x - d, y), sigma)
    }
  }
  return total * h * h
}

describe('two sites at distance d: annual candidate counts', () => {
  // N_i,y | storms ~ Poisson(r_i·Λ_i,y), Λ_i,y = Σ_c (μ/λmax)·k(x_i − c): a Cox process driven by
  // Poisson shot noise. Campbell's theorem (Møller & Waagepetersen 2004, "Statistical Inference and
  // Simulation for Spatial Point Processes", §5.3; Illian et al. 2008 §6.3) gives E[Λ] = κ·(μ/λmax)·∫k = 1 and
  // Cov(Λ_1, Λ_2) = κ·(μ/λmax)²·∫k(x_1 − c)k(x_2 − c)dc = (μ/λmax)·h(d); so
  // Var N_i = r_i + r_i²·(μ/λmax)·h(0) and Cov(N_1, N_2) = r_1·r_2·(μ/λmax)·h(d).
  // For the untruncated Gaussian h(d) = exp(−d²/(4σ²))/(4πσ²) (the convolution of two Gaussians: φ_{σ√2}(d)).
  const sigma = 2
  const base: Omit<SiteClustering, 'xKm' | 'yKm'> = { maxFlashDensity: 5, spreadKm: sigma, flashesPerStorm: 100 }
  const years = 20_000
  const r1 = 5, r2 = 3
  const countsAt = (x: number, y: number, rate: number, id: string) => {
    const counts = new Float64Array(years)
    for (const yr of clusteredCandidateYears({ ...base, xKm: x, yKm: y }, rate, years, 'pair', createStream('pair', id, 'years/storms'))) counts[yr]! += 1
    return counts
  }
  const covariance = (a: Float64Array, b: Float64Array) => {
    const ma = meanVar(a).m, mb = meanVar(b).m
    const products = a.map((v, i) => (v - ma) * (b[i]! - mb))
    const { m, v } = meanVar(products)
    return { cov: m * years / (years - 1), se: Math.sqrt(v / years) }
  }
  const a = countsAt(10, 20, r1, 'a')

  it('the overlap integral of the truncated kernel equals the Gaussian closed form to 0.1 %', () => {
    // Renormalising the cut kernel raises h(0) by (1 − e^(−16))/(1 − e^(−8))² − 1 ≈ 6.7e-4.
    for (const d of [0, 2, 5]) expect(Math.abs(kernelOverlap(d, sigma) / (Math.exp(-d * d / (4 * sigma * sigma)) / (4 * Math.PI * sigma * sigma)) - 1)).toBeLessThan(1e-3)
  })

  it('each site keeps its rate; its variance is r + r²·Var Λ', () => {
    const { m, v } = meanVar(a)
    const varLambda = yearFactorVariance(base)
    expect(varLambda).toBeCloseTo((base.flashesPerStorm / base.maxFlashDensity) * kernelOverlap(0, sigma), 4)
    const expectedVar = r1 + r1 * r1 * varLambda
    expect(Math.abs(m - r1)).toBeLessThan(4 * Math.sqrt(expectedVar / years))
    // Var of a sample variance ≈ (μ4 − σ⁴)/n; bounded here by a generous 15 % (the shot noise has heavy tails).
    expect(v / expectedVar).toBeGreaterThan(0.85)
    expect(v / expectedVar).toBeLessThan(1.15)
  })

  for (const d of [1.5, 4]) {
    it(`at d = ${d} km the covariance matches r₁r₂(μ/λmax)h(d)`, () => {
      const b = countsAt(10 + d, 20, r2, `b${d}`)
      const { cov, se } = covariance(a, b)
      const expected = r1 * r2 * (base.flashesPerStorm / base.maxFlashDensity) * kernelOverlap(d, sigma)
      expect(expected).toBeGreaterThan(5 * se) // the test can tell clustering from none
      expect(Math.abs(cov - expected)).toBeLessThan(4 * se)
    })
  }

  it('sites farther apart than twice the reach are uncorrelated', () => {
    const far = countsAt(10 + 2 * REACH_SIGMAS * sigma + 1, 20, r2, 'far')
    const { cov, se } = covariance(a, far)
    expect(Math.abs(cov)).toBeLessThan(4 * se)
  })

  it('a site\'s years are the same whoever else is simulated, and depend on the run seed', () => {
    const again = countsAt(10, 20, r1, 'a')
    expect(again).toEqual(a)
    const otherSeed = new Float64Array(years)
    for (const yr of clusteredCandidateYears({ ...base, xKm: 10, yKm: 20 }, r1, years, 'other', createStream('pair', 'a', 'years/storms'))) otherSeed[yr]! += 1
    expect(otherSeed).not.toEqual(a)
  })
})

describe('pair correlation of the simulated storm flashes', () => {
  // Thomas process: g(r) = 1 + exp(−r²/(4σ²))/(4πσ²κ) (Illian, Penttinen, Stoyan & Stoyan 2008,
  // "Statistical Analysis and Modelling of Spatial Point Patterns", §6.3.2; Møller & Waagepetersen
  // 2004 §5.3); averaged over an annulus [r₁, r₂): 1 + (e^(−r₁²/4σ²) − e^(−r₂²/4σ²))/(κπ(r₂² − r₁²)).
  // Estimated per year (one time window) with the translation edge correction (Ohser & Stoyan 1981)
  // and the known intensity λ; the years are independent, so their spread gives the sampling error.
  const sigma = 1
  const c = { maxFlashDensity: 1, spreadKm: sigma, flashesPerStorm: 50 }
  const kappa = c.maxFlashDensity / c.flashesPerStorm
  const L = 60
  const bins: [number, number][] = [[0, 0.5], [0.5, 1], [1, 1.5], [1.5, 2.5], [2.5, 4], [4, 6]]
  const perYear: number[][] = []
  for (let year = 0; year < 12; year++) {
    const flashes = stormFlashes(c, 'thomas', { x0: 0, x1: L, y0: 0, y1: L }, year)
    const sums = new Float64Array(bins.length)
    const rMax = bins[bins.length - 1]![1]
    const xs = Float64Array.from(flashes, (f) => f.xKm), ys = Float64Array.from(flashes, (f) => f.yKm)
    for (let i = 0; i < xs.length; i++) {
      for (let j = i + 1; j < xs.length; j++) {
        const dx = Math.abs(xs[i]! - xs[j]!)
        if (dx >= rMax) continue
        const dy = Math.abs(ys[i]! - ys[j]!)
        const r = Math.hypot(dx, dy)
        if (r >= rMax) continue
        const b = bins.findIndex(([lo, hi]) => r >= lo && r < hi)
        sums[b]! += 2 / ((L - dx) * (L - dy))
      }
    }
    const lambda = c.maxFlashDensity
    perYear.push(bins.map(([lo, hi], b) => sums[b]! / (lambda * lambda * Math.PI * (hi * hi - lo * lo))))
  }
  for (const [b, [lo, hi]] of bins.entries()) {
    it(`g on [${lo}, ${hi}) km`, () => {
      const { m, v } = meanVar(perYear.map((g) => g[b]!))
      const expected = 1 + (Math.exp(-lo * lo / (4 * sigma * sigma)) - Math.exp(-hi * hi / (4 * sigma * sigma))) / (kappa * Math.PI * (hi * hi - lo * lo))
      expect(Math.abs(m - expected)).toBeLessThan(4 * Math.sqrt(v / perYear.length))
    })
  }
  it('the flashes per year and km² equal λmax (marginal intensity)', () => {
    const counts = Array.from({ length: 12 }, (_, year) => stormFlashes(c, 'thomas', { x0: 0, x1: L, y0: 0, y1: L }, year).length / (L * L))
    const { m, v } = meanVar(counts)
    expect(Math.abs(m - c.maxFlashDensity)).toBeLessThan(4 * Math.sqrt(v / counts.length))
  })
})

describe('marginals: a site\'s rates with clustering', () => {
  // Clustering changes the years in which flashes fall, never their long-run rate (E[Λ] = 1): the
  // direct-strike, sparking and ignition rates agree with independent years and with frequency mode.
  const a = parseAssumptions({ stormClustering: { spreadKm: 5, flashesPerStorm: 200 } })
  const site = makeSite([makeTank({ heightM: 12, contents: 'crude' }), makeTank({ id: 't2', tag: 'TK-2', xM: 15, contents: 'condensate' })], [], { flashDensity: 8 })
  const clustering: SiteClustering = { xKm: 4, yKm: -2, maxFlashDensity: 10, ...a.stormClustering }
  const years = 60_000
  const clustered = simulateSiteYears(site, a, { runSeed: 5, years, clustering })
  const independent = simulateSiteYears(site, a, { runSeed: 5, years })
  const frequency = simulateSiteFrequency(site, a, { runSeed: 5, targetRse: 0.01 })
  const q = isolatedTankQuadrature(site.tanks[0]!, 8, a)
  // Var of a clustered count over Y years: Y·(r + r²·Var Λ) (above); of an independent one: Y·r.
  const varLambda = yearFactorVariance(clustering)
  for (const figure of ['direct', 'sparking', 'ignition'] as const) {
    it(`${figure}: clustered and independent years agree, and agree with frequency mode`, () => {
      const n1 = clustered.totals[figure].count, n0 = independent.totals[figure].count
      const r = n0 / years
      const sd = Math.sqrt(years * (r + r * r * varLambda) + years * r)
      expect(Math.abs(n1 - n0)).toBeLessThan(4 * sd)
      const f = frequency.totals[figure]
      expect(Math.abs(n1 / years - f.rate)).toBeLessThan(4 * Math.sqrt((r + r * r * varLambda) / years + f.se * f.se))
    })
  }
  it('the first tank\'s direct strikes match the quadrature', () => {
    const n = clustered.tanks[0]!.direct.count
    const r = q.directPerYear
    // The neighbour tank shields a little: the site's quadrature for an isolated tank is an upper bound.
    expect(n / years).toBeLessThan(r + 4 * Math.sqrt((r + r * r * varLambda) / years))
    expect(n / years).toBeGreaterThan(0.5 * r)
  })
  it('without clustering nothing changes: the option off reproduces the independent years', () => {
    const off = simulateSiteYears(site, a, { runSeed: 5, years, clustering: null })
    expect(off.yearLosses).toEqual(independent.yearLosses)
    expect(off.candidates).toBe(independent.candidates)
  })
  it('refuses a site whose Ng is above the run\'s λmax', () => {
    expect(() => simulateSiteYears(site, a, { runSeed: 5, years: 10, clustering: { ...clustering, maxFlashDensity: 4 } })).toThrow(/above the run's λmax/)
  })
})
