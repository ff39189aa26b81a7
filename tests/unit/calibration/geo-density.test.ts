import { describe, expect, it } from 'vitest'
import { EARTH_MEAN_RADIUS_KM, estimateFlashDensity, haversineKm, boundingBox, insideBox, CalibrationInputError } from '../../../shared/calibration'
import { poisson, rng, uniformInDisc } from './synthetic'

describe('great-circle distance (haversine)', () => {
  it('gives arc lengths that follow from the sphere', () => {
    // One degree along a meridian is R·π/180; a quarter meridian πR/2; antipodes πR (geometry of the sphere).
    expect(haversineKm(10, 20, 11, 20)).toBeCloseTo(EARTH_MEAN_RADIUS_KM * Math.PI / 180, 6)
    expect(haversineKm(0, 0, 90, 0)).toBeCloseTo(EARTH_MEAN_RADIUS_KM * Math.PI / 2, 6)
    expect(haversineKm(0, 0, 0, 180)).toBeCloseTo(EARTH_MEAN_RADIUS_KM * Math.PI, 6)
    // Along the equator one degree of longitude is also R·π/180; across the date line as well.
    expect(haversineKm(0, 179.5, 0, -179.5)).toBeCloseTo(EARTH_MEAN_RADIUS_KM * Math.PI / 180, 6)
  })

  it('pre-filters with a box that never drops a point inside the radius, also across the date line', () => {
    const r = rng('box')
    for (const [lat, lon] of [[-33.9, 151.2], [64.1, -21.9], [-17.7, 179.9], [0, -180]] as const) {
      const box = boundingBox(lat, lon, 25)
      for (let k = 0; k < 500; k++) {
        const [pLat, pLon] = uniformInDisc(r, lat, lon, 25)
        expect(insideBox(box, pLat, pLon)).toBe(true)
      }
      expect(insideBox(box, lat + 1, lon)).toBe(false) // 111 km away (geometry of the sphere)
    }
  })
})

describe('ground flash density with its exact Poisson interval', () => {
  it('divides the count by area, period and detection efficiency; interval from Garwood', () => {
    // Exact 95 % interval for an observed Poisson count of 10: 4.795–18.39 (Garwood 1936; the
    // tabulated values in Ulm 1990, Am. J. Epidemiol. 131:373). Exposure: π·1² km² × 1 yr × 1.
    const e = estimateFlashDensity({ flashCount: 10, radiusKm: 1, periodYears: 1, detectionEfficiency: 1 })
    expect(e.ng).toBeCloseTo(10 / Math.PI, 10)
    expect(e.lo).toBeCloseTo(4.7954 / Math.PI, 3)
    expect(e.hi).toBeCloseTo(18.3904 / Math.PI, 3)
    // Detection efficiency 0.8 scales Ng up by 1/0.8 (MODEL.md §7).
    const de = estimateFlashDensity({ flashCount: 10, radiusKm: 1, periodYears: 1, detectionEfficiency: 0.8 })
    expect(de.ng / e.ng).toBeCloseTo(1.25, 12)
    // Zero flashes: the lower bound is 0 and the upper −ln(0.025) = 3.689 (Garwood 1936).
    const none = estimateFlashDensity({ flashCount: 0, radiusKm: 1, periodYears: 1, detectionEfficiency: 1 })
    expect(none.lo).toBe(0)
    expect(none.hi * Math.PI).toBeCloseTo(3.6889, 3)
  })

  it('refuses impossible inputs with a readable message', () => {
    expect(() => estimateFlashDensity({ flashCount: 3, radiusKm: 0, periodYears: 1, detectionEfficiency: 1.2 })).toThrow(CalibrationInputError)
    expect(() => estimateFlashDensity({ flashCount: 3, radiusKm: 0, periodYears: 1, detectionEfficiency: 1.2 })).toThrow(/radius.*detection efficiency/s)
  })

  it('recovers a known density within its interval in about 95 % of repeated synthetic records', () => {
    // Known truth: Ng = 4 /km²/yr over 5 years, 85 % detected, counted within 5 km; flashes are
    // thrown uniformly over a 7 km disc (Poisson process, MODEL.md §1), then thinned by detection.
    const trueNg = 4, years = 5, de = 0.85, outerKm = 7, radiusKm = 5
    const site = { lat: 29.7, lon: -95.3 }
    const trials = 300
    let covered = 0
    let sum = 0
    for (let seed = 0; seed < trials; seed++) {
      const r = rng(`density-${seed}`)
      const total = poisson(r, trueNg * Math.PI * outerKm ** 2 * years)
      let counted = 0
      for (let k = 0; k < total; k++) {
        const [lat, lon] = uniformInDisc(r, site.lat, site.lon, outerKm)
        if (r() < de && haversineKm(site.lat, site.lon, lat, lon) <= radiusKm) counted++
      }
      const e = estimateFlashDensity({ flashCount: counted, radiusKm, periodYears: years, detectionEfficiency: de })
      sum += e.ng
      if (e.lo <= trueNg && trueNg <= e.hi) covered++
    }
    // The exact interval is conservative: coverage at least the nominal 95 %, less a Monte Carlo
    // allowance of ~2.5 binomial standard errors (√(0.95·0.05/300) = 1.3 %); common practice.
    expect(covered / trials).toBeGreaterThanOrEqual(0.92)
    expect(covered / trials).toBeLessThanOrEqual(0.995)
    // Unbiased: the mean estimate is within 1 % of the truth (SE of the mean ≈ 0.2 %).
    expect(sum / trials).toBeGreaterThan(trueNg * 0.99)
    expect(sum / trials).toBeLessThan(trueNg * 1.01)
  })
})
