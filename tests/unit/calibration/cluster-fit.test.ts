// Storm clustering calibration: Ripley's K with the translation correction, the Thomas K closed form,
// minimum contrast, and recovery of known parameters from records simulated by a Thomas process.
import { describe, expect, it } from 'vitest'
import {
  fitStormClustering, fitThomasMinimumContrast, kFunction, MINIMUM_CONTRAST, pooledK, pooledThomasK, siblingPairsInWindow, projectBox, radiiGrid, simulatePoisson, simulateThomas,
  thinningShare, thomasK,
} from '../../../shared/calibration/cluster-fit'
import { thomasRecords } from '../../support/thomas-records'
import { createStream } from '../../../shared/engine/random'
import { stormFlashes } from '../../../shared/engine/storm-clusters'

const square = { width: 100, height: 100 }

describe('Thomas K function', () => {
  it('is the closed form πr² + (1 − exp(−r²/4σ²))/κ (Illian et al. 2008 eq. 6.3.9)', () => {
    // Hand-worked: r = 2σ → 1 − e⁻¹ = 0.632121; κ = 0.01 → 63.2121 on top of π·4σ².
    const sigma = 3, kappa = 0.01
    expect(thomasK(6, kappa, sigma)).toBeCloseTo(Math.PI * 36 + 63.21206, 4)
    // Far beyond σ the excess tends to 1/κ (the mean pairs per point from its own storm, over λ).
    expect(thomasK(1000, kappa, sigma) - Math.PI * 1e6).toBeCloseTo(100, 6)
    // Small r: excess ≈ r²/(4σ²κ) (Taylor of 1 − e⁻ˣ).
    expect(thomasK(0.01, kappa, sigma) - Math.PI * 1e-4).toBeCloseTo(1e-4 / (36 * kappa), 9)
  })

  it('agrees with the K of simulated Thomas patterns pooled over many windows (within 5 %)', () => {
    // Thomas process K (Møller & Waagepetersen 2004 ex. 5.3) as the ratio-pooled estimate expects it
    // (÷ (1 + I/(κ|W|²)), here 1/1.18 with 1/κ = 2,000 km² in a 100 km square); tolerance from the
    // spread of the pooled estimate over 300 windows, about 2 % at these radii (repeated seeds).
    const u = createStream(11, 'test', 'thomas-k')
    const patterns = Array.from({ length: 300 }, () => simulateThomas(u, square, 0.0005, 60, 4))
    const radii = radiiGrid(25, 5)
    const { k } = pooledK(patterns, square, radii)
    for (let i = 0; i < radii.length; i++) expect(k[i]! / pooledThomasK(radii[i]!, 0.0005, 4, square)).toBeGreaterThan(0.95)
    for (let i = 0; i < radii.length; i++) expect(k[i]! / pooledThomasK(radii[i]!, 0.0005, 4, square)).toBeLessThan(1.05)
    // Against the plain K the pooled estimate is low by the sibling-pair share, ≈ 15 %.
    expect(k[4]! / thomasK(25, 0.0005, 4)).toBeLessThan(0.9)
  })

  it('counts the sibling pairs inside a rectangle as the quadrature of (a − |x|)(b − |y|) φ', () => {
    // Reference: trapezoid quadrature (10,000 steps) of ∫₋ₐᵃ (a − |x|) φ_s(x) dx per axis, s = σ√2.
    const sigma = 12, s = sigma * Math.SQRT2
    const axis = (a: number) => {
      const n = 10_000, h = (2 * a) / n
      let sum = 0
      for (let i = 0; i <= n; i++) {
        const x = -a + i * h
        const f = (a - Math.abs(x)) * Math.exp(-(x * x) / (2 * s * s)) / (s * Math.sqrt(2 * Math.PI))
        sum += (i === 0 || i === n ? 0.5 : 1) * f
      }
      return sum * h
    }
    expect(siblingPairsInWindow({ width: 60, height: 90 }, sigma) / (axis(60) * axis(90))).toBeCloseTo(1, 6)
  })
})

describe('Ripley K with the translation correction', () => {
  it('is πr² for a Poisson pattern within sampling error (Ripley 1976)', () => {
    // Ripley 1976: for a Poisson process K(r) = πr². With the translation correction the estimate
    // is ratio-unbiased; its standard deviation for n ≈ 2,000 points in the unit square is about
    // 1 % of πr² at r = 0.1–0.25 of the side (Diggle 2003 §4.3, from memory) — 4 % allowed.
    const u = createStream(7, 'test', 'poisson')
    const points = simulatePoisson(u, square, 0.2)
    const radii = radiiGrid(25, 5)
    const k = kFunction(points, square, radii)
    for (let i = 0; i < radii.length; i++) expect(k[i]! / (Math.PI * radii[i]! ** 2)).toBeCloseTo(1, 1)
    expect(Math.abs(k[4]! / (Math.PI * 625) - 1)).toBeLessThan(0.04)
  })

  it('weights a pair by |W| / ((a − |dx|)(b − |dy|)) (Ohser & Stoyan 1981), hand-worked', () => {
    // Two points 3 km apart along x in a 10 × 10 km square: weight 100 / (7 × 10); K̂(r ≥ 3) = |W|/(n(n−1)) · 2 · weight.
    const k = kFunction([{ x: 1, y: 5 }, { x: 4, y: 5 }], { width: 10, height: 10 }, radiiGrid(4, 4))
    expect(k[1]).toBe(0)
    expect(k[2]).toBeCloseTo((100 / 2) * 2 * (100 / 70), 10)
    expect(k[3]).toBeCloseTo((100 / 2) * 2 * (100 / 70), 10)
  })

  it('finds no clustering in a Poisson pattern', () => {
    const u = createStream(8, 'test', 'poisson-fit')
    const patterns = Array.from({ length: 20 }, () => simulatePoisson(u, square, 0.05))
    const radii = radiiGrid(25)
    const { k } = pooledK(patterns, square, radii)
    const result = fitThomasMinimumContrast(k, radii, square)
    // Either refused as "no clustering" or a cluster excess 1/κ far below the window (a negligible clustering).
    if (result.fit) expect(1 / result.fit.kappa).toBeLessThan(20)
    else expect(result.problem).toMatch(/No clustering/)
  })
})

describe('thinning share', () => {
  it('keeps Σ (p·n)² at the budget with one p for every window', () => {
    // Hand-worked: counts 300 and 400 give Σ n² = 250,000; a budget of 62,500 needs p = √(62,500 / 250,000) = 0.5.
    expect(thinningShare([300, 400], 62_500)).toBeCloseTo(0.5, 12)
    expect(thinningShare([10, 20], 1e6)).toBe(1)
  })
})

describe('fitStormClustering', () => {
  const box = { minLat: 30, maxLat: 32.7, minLon: -97, maxLon: -93.9 }

  it('recovers σ and μ of a simulated Thomas process within its bootstrap interval', () => {
    // Known parameters: σ = 8 km, μ = 150 flashes per storm, κ = 4 storms per day in a ≈ 300 × 300 km box.
    const { window } = projectBox(box)
    const area = window.width * window.height
    const records = thomasRecords({ box, days: 60, stormsPerDay: 4, flashesPerStorm: 150, spreadKm: 8, seed: 3 })
    const result = fitStormClustering(records, { box, windowHours: 24, detectionEfficiency: 1, periodYears: 60 / 365.25, bootstrap: 39, seed: 'test' })
    expect(result.intervals).not.toBeNull()
    const iv = result.intervals!
    expect(iv.spreadKm.lo).toBeLessThanOrEqual(8)
    expect(iv.spreadKm.hi).toBeGreaterThanOrEqual(8)
    expect(iv.flashesPerStorm.lo).toBeLessThanOrEqual(150)
    expect(iv.flashesPerStorm.hi).toBeGreaterThanOrEqual(150)
    // Stated tolerance besides the interval: 15 % on σ, 30 % on μ (common practice for 60 windows of ~4 storms).
    expect(result.spreadKm / 8).toBeGreaterThan(0.85)
    expect(result.spreadKm / 8).toBeLessThan(1.15)
    expect(result.flashesPerStorm / 150).toBeGreaterThan(0.7)
    expect(result.flashesPerStorm / 150).toBeLessThan(1.3)
    // κ per year follows from the windows: 4 storms per day per box ⇒ 4 × 365.25 / area per km² per year.
    expect(iv.kappaPerKm2PerYear.lo).toBeLessThanOrEqual(4 * 365.25 / area)
    expect(iv.kappaPerKm2PerYear.hi).toBeGreaterThanOrEqual(4 * 365.25 / area)
    // One window per simulated day that holds two or more flashes (days without a storm hold none).
    const perDay = new Map<number, number>()
    for (const r of records) perDay.set(Math.floor(r.timeMs / 86400e3), (perDay.get(Math.floor(r.timeMs / 86400e3)) ?? 0) + 1)
    expect(result.windows.used).toBe([...perDay.values()].filter(n => n >= 2).length)
    expect(result.windows.used).toBeGreaterThan(50)
  })

  it('divides μ by the detection efficiency and keeps σ (independent thinning leaves K alone)', () => {
    const records = thomasRecords({ box, days: 30, stormsPerDay: 4, flashesPerStorm: 150, spreadKm: 8, seed: 5 })
    const full = fitStormClustering(records, { box, windowHours: 24, detectionEfficiency: 1, periodYears: 1, bootstrap: 0, seed: 'a' })
    const half = fitStormClustering(records, { box, windowHours: 24, detectionEfficiency: 0.5, periodYears: 1, bootstrap: 0, seed: 'a' })
    expect(half.spreadKm).toBe(full.spreadKm)
    expect(half.flashesPerStorm).toBeCloseTo(2 * full.flashesPerStorm, 8)
    expect(full.intervals).toBeNull()
  })

  it('recovers σ and μ when the number of storms varies from day to day', () => {
    // 40 days of 1 storm and 40 days of 10 (σ = 8 km, μ = 150): μ from Σn(n − 1) = μ Σλ (κ|W|² + I)
    // holds for any mix of storm counts when storms are alike (docs/methodology.md). Stated tolerance:
    // 15 % on σ, 20 % on μ (common practice; the seed spread is about 5 %).
    const a = thomasRecords({ box, days: 40, stormsPerDay: 1, flashesPerStorm: 150, spreadKm: 8, seed: 11 })
    const b = thomasRecords({ box, days: 40, stormsPerDay: 10, flashesPerStorm: 150, spreadKm: 8, seed: 12 }).map(r => ({ ...r, timeMs: r.timeMs + 40 * 86400e3 }))
    const result = fitStormClustering([...a, ...b], { box, windowHours: 24, detectionEfficiency: 1, periodYears: 80 / 365.25, bootstrap: 0, seed: 'mix' })
    expect(Math.abs(result.spreadKm / 8 - 1)).toBeLessThan(0.15)
    expect(Math.abs(result.flashesPerStorm / 150 - 1)).toBeLessThan(0.2)
    // Storms per year: 5.5 a day on average over the box (flash density ÷ μ), within the same 20 %.
    const { window } = projectBox(box)
    expect(Math.abs(result.kappaPerKm2PerYear / (5.5 * 365.25 / (window.width * window.height)) - 1)).toBeLessThan(0.2)
  })

  it('refuses records with no window of two flashes', () => {
    const records = [{ timeMs: 0, latDeg: 31, lonDeg: -95 }, { timeMs: 86400e3 * 2, latDeg: 31, lonDeg: -95 }]
    expect(() => fitStormClustering(records, { box, windowHours: 24, detectionEfficiency: 1, periodYears: 1, bootstrap: 0, seed: 'a' })).toThrow(/No time window/)
  })
})

describe('the calibration and the runs share one process', () => {
  it('recovers σ and κ of the storm field that simulated-years runs draw (shared/engine/storm-clusters.ts)', () => {
    // The runs' own storms in a 60 km square, each simulated year one pattern (storms are instant
    // within a year); known σ = 3 km, μ = 100 flashes per storm, λmax = 0.5 flashes/km²/yr, so
    // κ = λ/μ = 0.005 storms/km²/yr (the Thomas parametrisation, Møller & Waagepetersen 2004 §5.3).
    // Tolerances 15 % on σ and 30 % on κ, as stated above for the records' fit (common practice); 60 windows of ~18 storms each.
    const field = { maxFlashDensity: 0.5, spreadKm: 3, flashesPerStorm: 100 }
    const window = { width: 60, height: 60 }
    const patterns = Array.from({ length: 60 }, (_, year) =>
      stormFlashes(field, 'calibration-check', { x0: 0, x1: 60, y0: 0, y1: 60 }, year).map(f => ({ x: f.xKm, y: f.yKm })))
    const meanCount = patterns.reduce((n, p) => n + p.length, 0) / patterns.length
    expect(meanCount / (60 * 60)).toBeGreaterThan(0.5 * 0.8) // the field keeps its flash density (within its scatter)
    expect(meanCount / (60 * 60)).toBeLessThan(0.5 * 1.2)
    const radii = radiiGrid(MINIMUM_CONTRAST.rangeShareOfSide * 60)
    const { k } = pooledK(patterns, window, radii)
    const result = fitThomasMinimumContrast(k, radii, window)
    expect(result.problem).toBeNull()
    expect(result.fit!.sigma / 3).toBeGreaterThan(0.85)
    expect(result.fit!.sigma / 3).toBeLessThan(1.15)
    expect(result.fit!.kappa / 0.005).toBeGreaterThan(0.7)
    expect(result.fit!.kappa / 0.005).toBeLessThan(1.3)
  })
})
