import { describe, expect, it } from 'vitest'
import {
  analyseSite, CalibrationInputError, groupIntoFlashes, haversineKm, impulseCsv, isRecord, parseImpulseCsv, parseLightningRow,
  parseRecordTime, readLightningHeader, splitCsvLine, type NearbyStroke,
} from '../../../shared/calibration'
import { destination, normal, poisson, rng, uniformInDisc } from './synthetic'

const HEADER = 'time,latitude,longitude,peak_current_ka,type,location_error_km'

describe('lightning-location CSV', () => {
  it('names missing and unknown columns', () => {
    const { problems } = readLightningHeader('when,lat,lon,peak_current_ka,type')
    expect(problems[0]).toBe('Missing columns: time, latitude, longitude.')
    expect(problems[1]).toBe('Unknown columns: when, lat, lon.')
    expect(problems.at(-1)).toMatch(/first line must name the columns time, latitude, longitude, peak_current_ka, type/)
    expect(readLightningHeader('\uFEFFTime,Latitude,Longitude,Peak_Current_kA,Type').problems).toEqual([])
  })

  it('reads a good row and lists every problem of a bad one', () => {
    const { columns } = readLightningHeader(HEADER)
    const good = parseLightningRow(splitCsvLine('2023-07-14T15:32:10.125Z,29.76,-95.37,-23.4,ground,0.2'), columns)
    expect(isRecord(good) && good).toEqual({ timeMs: Date.UTC(2023, 6, 14, 15, 32, 10, 125), latDeg: 29.76, lonDeg: -95.37, peakCurrentKa: -23.4, type: 'ground', locationErrorKm: 0.2 })
    const bad = parseLightningRow(splitCsvLine('2023-02-30 10:00,95.1,-200,0,storm,-1'), columns)
    expect(isRecord(bad)).toBe(false)
    // Latitude beyond ±90° and longitude beyond ±180° are impossible (WGS 84).
    expect(!isRecord(bad) && bad.problems).toEqual([
      'time "2023-02-30 10:00" is not an ISO 8601 date and time (e.g. 2023-07-14T15:32:10.125Z)',
      'latitude "95.1" must be decimal degrees between −90 and 90',
      'longitude "-200" must be decimal degrees between −180 and 180',
      'peak_current_ka "0" must be a signed current in kA, not 0, at most 1000 kA in magnitude',
      'type "storm" must be ground or cloud',
      'location_error_km "-1" must be between 0 and 100 km',
    ])
  })

  it('reads times with offsets and without a zone as UTC', () => {
    // ISO 8601: +02:00 is two hours ahead of UTC.
    expect(parseRecordTime('2023-07-14T17:32:10+02:00')).toBe(Date.UTC(2023, 6, 14, 15, 32, 10))
    expect(parseRecordTime('2023-07-14 15:32')).toBe(Date.UTC(2023, 6, 14, 15, 32))
    expect(parseRecordTime('14/07/2023 15:32')).toBeNaN()
  })

  it('splits quoted cells (RFC 4180)', () => {
    expect(splitCsvLine('"a, b",2,"say ""hi"""')).toEqual(['a, b', '2', 'say "hi"'])
  })
})

describe('impulse test CSV', () => {
  it('reads level and outcome in order and writes them back the same', () => {
    const series = parseImpulseCsv('level_kv,spark\n90,no\n92,1\r\n90,N\n')
    expect(series).toEqual([{ levelKv: 90, spark: false }, { levelKv: 92, spark: true }, { levelKv: 90, spark: false }])
    expect(parseImpulseCsv(impulseCsv(series))).toEqual(series)
  })

  it('refuses wrong columns, bad rows and an empty series with clear messages', () => {
    expect(() => parseImpulseCsv('voltage,result\n90,no')).toThrow('Missing columns: level_kv, spark.')
    expect(() => parseImpulseCsv('level_kv,spark\n-5,maybe\n')).toThrow('Line 2: level_kv "-5" must be a voltage above 0 kV; spark "maybe" must be yes or no (or 1 / 0).')
    expect(() => parseImpulseCsv('level_kv,spark\n')).toThrow(/series is empty/)
    expect(() => parseImpulseCsv('')).toThrow(CalibrationInputError)
  })
})

describe('from records near a site to Ng and a current fit', () => {
  it('groups strokes into flashes by time and distance (Cummins et al. 1998 rule)', () => {
    const s = (row: number, timeMs: number, lat: number, current: number): NearbyStroke => ({ row, timeMs, latDeg: lat, lonDeg: 0, peakCurrentKa: current, distanceKm: 0 })
    // 0.1° of latitude = 11.1 km (R·π/1800), beyond the 10 km limit.
    const firsts = groupIntoFlashes([
      s(1, 0, 0, -30), s(2, 80, 0.01, -12), s(3, 400, 0.02, -10), // one flash of three strokes
      s(4, 450, 0.1, -25), // same time, 11 km away: a new flash
      s(5, 1100, 0, -20), // 1.1 s after the first stroke: a new flash
      s(6, 5000, 0, -40), s(7, 5600, 0, -15), // 600 ms gap: two flashes
    ])
    expect(firsts.map(f => f.row)).toEqual([1, 4, 5, 6, 7])
  })

  it('recovers density and current law of synthetic strokes, grouped into flashes, within their intervals', () => {
    // Truth: Ng = 6 /km²/yr over 4 years, DE 0.9, currents CIGRE log-normal (31.1 kA, β 0.484),
    // recorded only from 10 kA; each flash has 1–4 strokes, later ones weaker, within 200 ms and 2 km.
    const r = rng('pipeline')
    const site = { lat: -23.5, lon: 133.9 }
    const strokes: NearbyStroke[] = []
    let row = 0
    const flashes = poisson(r, 6 * Math.PI * 12 ** 2 * 4)
    for (let k = 0; k < flashes; k++) {
      if (r() > 0.9) continue
      const t0 = Math.floor(r() * 4 * 365.25 * 86400e3)
      const [lat, lon] = uniformInDisc(r, site.lat, site.lon, 12)
      const first = Math.exp(Math.log(31.1) + 0.484 * normal(r))
      const n = 1 + Math.floor(r() * 4)
      for (let j = 0; j < n; j++) {
        const current = j === 0 ? first : first * 0.4
        if (current < 10) continue
        const [sLat, sLon] = j === 0 ? [lat, lon] : destination(lat, lon, r() * 2 * Math.PI, r() * 2)
        strokes.push({ row: row++, timeMs: t0 + j * 60, latDeg: sLat, lonDeg: sLon, peakCurrentKa: -current, distanceKm: haversineKm(site.lat, site.lon, sLat, sLon) })
      }
    }
    const { result } = analyseSite('s', strokes, { radiusKm: 10, periodYears: 4, detectionEfficiency: 0.9, thresholdKa: 10, recordsAre: 'strokes' })
    expect(result.flashDensity.lo).toBeLessThanOrEqual(6 * 0.99) // flashes whose first stroke fell below 10 kA are missed
    expect(result.flashDensity.hi).toBeGreaterThanOrEqual(6 * 0.99)
    expect(result.fit!.medianInterval.lo).toBeLessThanOrEqual(31.1)
    expect(result.fit!.medianInterval.hi).toBeGreaterThanOrEqual(31.1)
    expect(result.fit!.betaInterval.lo).toBeLessThanOrEqual(0.484)
    expect(result.fit!.betaInterval.hi).toBeGreaterThanOrEqual(0.484)
    // Treating every stroke as a flash would count subsequent strokes as flashes: far above the truth.
    const ungrouped = analyseSite('s', strokes, { radiusKm: 10, periodYears: 4, detectionEfficiency: 0.9, thresholdKa: 10, recordsAre: 'flashes' })
    expect(ungrouped.result.flashDensity.lo).toBeGreaterThan(6)
  })
})
