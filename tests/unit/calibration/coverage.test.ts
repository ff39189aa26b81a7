// Calibration warnings: records that do not cover a chosen site, and implausible flash densities.
import { describe, expect, it } from 'vitest'
import { coverageWarning, distanceToExtentKm, FLASH_DENSITY_BOUNDS, flashDensityWarning } from '../../../shared/calibration/coverage'

const extent = { latitudeRange: [29, 30] as [number, number], longitudeRange: [-96, -95] as [number, number] }
const site = (latDeg: number, lonDeg: number) => ({ name: 'Bayou tank farm', latDeg, lonDeg })

describe('coverageWarning', () => {
  it('warns of a site outside the records\' extent, with the distance', () => {
    // One degree of latitude north of the box: 111.19 km on the mean sphere (2π·6371.0088/360, hand-worked).
    expect(distanceToExtentKm(31, -95.5, extent)).toBeCloseTo(111.19, 1)
    expect(coverageWarning(site(31, -95.5), 0, 10, extent)).toMatch(/do not cover Bayou tank farm: it lies 110 km outside/)
  })
  it('warns when no record lies within the radius', () => {
    expect(coverageWarning(site(29.5, -95.5), 0, 10, extent)).toMatch(/No record lies within 10 km/)
    expect(coverageWarning(site(29.5, -95.5), 0, 10, null)).toMatch(/No record lies within 10 km/)
  })
  it('warns when the circle reaches beyond the extent, and not when it lies inside', () => {
    // 0.05° of latitude from the southern edge is 5.6 km: a 10 km circle reaches 4.4 km beyond (hand-worked).
    expect(coverageWarning(site(29.05, -95.5), 12, 10, extent)).toMatch(/reaches 4\.4 km beyond/)
    // At the centre the nearest edge is 0.5° of longitude × cos 29.5° × 111.19 km = 48.4 km away: a 10 km circle fits.
    expect(coverageWarning(site(29.5, -95.5), 12, 10, extent)).toBeNull()
  })
})

describe('flashDensityWarning', () => {
  it('flags a density above the region\'s bound and names the bound and its source', () => {
    const w = flashDensityWarning(site(29.5, -95.5), 45)!
    expect(w).toMatch(/implausible for the contiguous United States: plausible values stay below 20/)
    expect(w).toMatch(/NLDN/)
    expect(flashDensityWarning(site(29.5, -95.5), 6)).toBeNull()
    // Outside every named region the global bound applies.
    expect(flashDensityWarning(site(9.8, -71.6), 60)).toBeNull()
    expect(flashDensityWarning(site(9.8, -71.6), 120)).toMatch(/anywhere on Earth/)
    expect(flashDensityWarning(site(65, 25), 3)).toMatch(/beyond 60°/)
  })
  it('every region names a source', () => {
    for (const b of FLASH_DENSITY_BOUNDS) expect(b.source.length).toBeGreaterThan(20)
  })
})
