// Calibration from data (issue 9) through the routes, against the real database.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { defaultAssumptions } from '../../shared/engine/assumptions'
import { createOrganisation, memberClient, type Client } from '../support/accounts'
import { testPool } from '../support/db'
import { normal, poisson, rng, uniformInDisc } from '../unit/calibration/synthetic'
import { coverageWarning } from '../../shared/calibration/coverage'

const pool = testPool()
afterAll(() => pool.end())

let org: string
let analyst: Client
let viewer: Client
let siteId: string
let farSiteId: string
let versionId: string

const SITE = { lat: 29.76, lon: -95.37 }
// Truth for the synthetic records: Ng 5 /km²/yr over 3 years, all detected, CIGRE log-normal
// currents (31.1 kA, β 0.484; Anderson & Eriksson 1980), network threshold 5 kA.
const TRUE_NG = 5
const YEARS = 3

function syntheticRecords(): string {
  const r = rng('server-records')
  const lines = ['time,latitude,longitude,peak_current_ka,type,location_error_km']
  const n = poisson(r, TRUE_NG * Math.PI * 12 ** 2 * YEARS)
  const start = Date.UTC(2020, 0, 1)
  for (let k = 0; k < n; k++) {
    const [lat, lon] = uniformInDisc(r, SITE.lat, SITE.lon, 12)
    const current = Math.exp(Math.log(31.1) + 0.484 * normal(r))
    if (current < 5) continue
    const sign = r() < 0.9 ? -1 : 1
    const time = new Date(start + r() * YEARS * 365.25 * 86400e3).toISOString()
    lines.push(`${time},${lat.toFixed(5)},${lon.toFixed(5)},${(sign * current).toFixed(1)},ground,0.2`)
    if (r() < 0.5) lines.push(`${time},${lat.toFixed(5)},${lon.toFixed(5)},${((r() < 0.5 ? -1 : 1) * (1 + 9 * r())).toFixed(1)},cloud,`)
  }
  return lines.join('\n') + '\n'
}

async function upload(client: Client, name: string, text: string): Promise<Response> {
  return fetch(`${inject('baseUrl')}/api/calibrations/lightning-files?name=${encodeURIComponent(name)}`, {
    method: 'POST', headers: { cookie: client.cookie, 'content-type': 'text/csv' }, body: text,
  })
}

const count = async (table: string) => Number((await pool.query(`SELECT count(*)::int AS n FROM ${table} WHERE organisation_id = $1`, [org])).rows[0].n)

beforeAll(async () => {
  org = await createOrganisation(pool, 'Calibration Test Operator')
  analyst = await memberClient(pool, org, 'analyst')
  viewer = await memberClient(pool, org, 'viewer')
  const site = await pool.query(`INSERT INTO sites (organisation_id, external_id, name, latitude_deg, longitude_deg, thunderstorm_days_per_yr) VALUES ($1, 'S-1', 'Bayou tank farm', $2, $3, 60) RETURNING id`, [org, SITE.lat, SITE.lon])
  siteId = site.rows[0].id
  const far = await pool.query(`INSERT INTO sites (organisation_id, external_id, name, latitude_deg, longitude_deg, flash_density_per_km2_yr) VALUES ($1, 'S-2', 'Far away terminal', 40.0, -100.0, 2) RETURNING id`, [org])
  farSiteId = far.rows[0].id
  const set = await pool.query(`INSERT INTO assumption_sets (organisation_id, name) VALUES ($1, 'Fleet defaults') RETURNING id`, [org])
  const version = await pool.query(`INSERT INTO assumption_set_versions (assumption_set_id, version, parameters, provenance) VALUES ($1, 1, $2, '{"powerLawExponent":{"source":"earlier"}}') RETURNING id`, [set.rows[0].id, JSON.stringify(defaultAssumptions)])
  versionId = version.rows[0].id
})

describe('lightning-location records', () => {
  let fileId: string
  let calibrationId: string
  let fileSummary: { latitudeRange: [number, number] | null, longitudeRange: [number, number] | null }
  const records = syntheticRecords()

  it('refuses bad files with clear messages and stores nothing', async () => {
    const wrongColumns = await upload(analyst, 'wrong.csv', 'when,lat,lon,kA\n2021-01-01T00:00:00Z,1,2,-30\n')
    expect(wrongColumns.status).toBe(400)
    expect((await wrongColumns.json()).statusMessage).toMatch(/^The file's columns are not right\. Missing columns: time, latitude, longitude, peak_current_ka, type\./)

    const impossible = await upload(analyst, 'impossible.csv', 'time,latitude,longitude,peak_current_ka,type\n2021-01-01T00:00:00Z,29.7,-95.3,-30,ground\n2021-01-01T00:00:01Z,91.5,-95.3,-30,ground\n2021-01-01T00:00:02Z,29.7,200,-30,ground\n')
    expect(impossible.status).toBe(400)
    const body = await impossible.json()
    expect(body.statusMessage).toBe('2 of 3 records have errors; nothing was stored. Correct them and upload again.')
    // Latitude beyond 90° and longitude beyond 180° are impossible (WGS 84); lines counted from the header as line 1.
    expect(body.data.rowErrors).toEqual([
      { line: 3, message: 'latitude "91.5" must be decimal degrees between −90 and 90' },
      { line: 4, message: 'longitude "200" must be decimal degrees between −180 and 180' },
    ])

    const empty = await upload(analyst, 'empty.csv', '')
    expect(empty.status).toBe(400)
    expect((await empty.json()).statusMessage).toMatch(/^The file is empty\./)
    const headerOnly = await upload(analyst, 'header.csv', 'time,latitude,longitude,peak_current_ka,type\n')
    expect((await headerOnly.json()).statusMessage).toBe('The file has a header line but no records.')

    expect(await count('calibration_files')).toBe(0)
    expect(Number((await pool.query(`SELECT count(*)::int AS n FROM audit_events WHERE organisation_id = $1 AND entity = 'calibration_file'`, [org])).rows[0].n)).toBe(0)
  })

  it('stores a valid file with its summary, and audits the upload', async () => {
    const res = await upload(analyst, 'gulf-2020-2022.csv', records)
    const file = await res.json()
    expect(res.status, file.statusMessage).toBe(201)
    fileId = file.id
    fileSummary = file.summary
    const dataLines = records.trim().split('\n').slice(1)
    expect(file.rowCount).toBe(dataLines.length)
    expect(file.summary.cloudRecords + file.summary.groundRecords).toBe(dataLines.length)
    expect(file.summary.groundRecords).toBe(dataLines.filter(l => l.endsWith('ground,0.2')).length)
    const audit = await pool.query(`SELECT action, after FROM audit_events WHERE organisation_id = $1 AND entity = 'calibration_file'`, [org])
    expect(audit.rows).toHaveLength(1)
    expect(audit.rows[0].after.fileName).toBe('gulf-2020-2022.csv')
    expect(viewer).toBeDefined()
    expect((await upload(viewer, 'x.csv', records)).status).toBe(403)
  })

  it('gives Ng with its exact interval and the truncated current fit per site, stored with its inputs', async () => {
    const res = await analyst.post('/api/calibrations/lightning', {
      title: 'Gulf coast 2020–2022', fileId, siteIds: [siteId, farSiteId], radiusKm: 10, detectionEfficiency: 1, thresholdKa: 5, recordsAre: 'flashes', periodYears: YEARS,
    })
    expect(res.status).toBe(201)
    const calibration = await res.json()
    calibrationId = calibration.id
    const near = calibration.results.sites.find((s: { siteId: string }) => s.siteId === siteId)
    // Flashes of a Poisson process with Ng = 5 counted over π·10² km² × 3 yr: the exact interval holds the truth.
    expect(near.flashDensity.lo).toBeLessThan(TRUE_NG)
    expect(near.flashDensity.hi).toBeGreaterThan(TRUE_NG)
    const far = calibration.results.sites.find((s: { siteId: string }) => s.siteId === farSiteId)
    expect(far.flashDensity.flashCount).toBe(0)
    // The results keep the records' extent (the file's summary), from which the page warns that the far site is not covered.
    expect(calibration.results.recordsExtent).toEqual({ latitudeRange: fileSummary.latitudeRange, longitudeRange: fileSummary.longitudeRange })
    expect(coverageWarning(far, 0, 10, calibration.results.recordsExtent)).toMatch(/do not cover|No record lies within 10 km/)
    // The records fill a 12 km disc around the near site (syntheticRecords), so its 10 km circle lies inside their extent.
    expect(coverageWarning(near, near.flashDensity.flashCount, 10, calibration.results.recordsExtent)).toBeNull()
    const fit = calibration.results.pooled.fit
    expect(fit.medianInterval.lo).toBeLessThan(31.1)
    expect(fit.medianInterval.hi).toBeGreaterThan(31.1)
    expect(calibration.results.pooled.curves).toHaveLength(3)
    const listed = await (await viewer.get('/api/calibrations')).json()
    expect(listed.map((c: { id: string }) => c.id)).toEqual([calibrationId])
  })

  it('turns the current fit into a new assumption version whose values say where they came from', async () => {
    const res = await analyst.post(`/api/calibrations/${calibrationId}/assumption-version`, { assumptionVersionId: versionId, note: 'Gulf coast currents' })
    expect(res.status).toBe(201)
    const body = await res.json()
    expect(body.version.version).toBe(2)
    const stored = (await pool.query(`SELECT parameters, provenance, note FROM assumption_set_versions WHERE id = $1`, [body.version.id])).rows[0]
    expect(stored.parameters.currentLaw).toBe('lognormal')
    expect(stored.parameters.lognormalMedianKa).toBe(body.values.lognormalMedianKa)
    expect(stored.parameters.powerLawExponent).toBe(defaultAssumptions.powerLawExponent) // untouched values carried over
    expect(stored.provenance.lognormalMedianKa.calibrationId).toBe(calibrationId)
    expect(stored.provenance.lognormalMedianKa.file.name).toBe('gulf-2020-2022.csv')
    expect(stored.provenance.lognormalMedianKa.method).toMatch(/truncated below at 5 kA/)
    expect(stored.provenance.powerLawExponent).toEqual({ source: 'earlier' }) // earlier provenance kept
    expect(stored.note).toBe('Gulf coast currents')
    // The fit's uncertainty comes with it (basis 'calibration', naming the calibration); the untouched power law keeps its illustrative range.
    const entry = (path: string) => stored.parameters.uncertainty.entries.find((e: { path: string }) => e.path === path)
    const fit = (await pool.query(`SELECT results FROM calibrations WHERE id = $1`, [calibrationId])).rows[0].results.pooled.fit
    expect(entry('lognormalMedianKa')).toMatchObject({ basis: 'calibration', distribution: { kind: 'lognormal', median: body.values.lognormalMedianKa, sigmaLn: Math.sqrt(fit.covariance[0]) } })
    expect(entry('lognormalMedianKa').note).toMatch(new RegExp(`calibration "Gulf coast 2020–2022" \\(id ${calibrationId.slice(0, 8)}, made \\d{4}-\\d{2}-\\d{2}\\)`))
    expect(entry('lognormalBeta')).toMatchObject({ basis: 'calibration', distribution: { kind: 'normal', mean: body.values.lognormalBeta, sd: Math.sqrt(fit.covariance[2]) } })
    expect(stored.parameters.uncertainty.correlations).toEqual([{ a: 'lognormalMedianKa', b: 'lognormalBeta', rho: expect.any(Number) }])
    expect(entry('powerLawExponent').basis).toBe('illustrative')
    // The flash count of the calibrated sites gives the flash density factor (Garwood 1936 interval; see tests/unit/calibration/uncertainty.test.ts).
    expect(entry('flashDensityFactor')).toMatchObject({ basis: 'calibration', distribution: { kind: 'lognormal' } })
    expect(entry('flashDensityFactor').note).toMatch(/flashes counted over 2 sites; .*Garwood 1936/)
    const detail = await (await viewer.get(`/api/calibrations/${calibrationId}`)).json()
    expect(detail.applications[0]).toMatchObject({ target: 'assumption_version', assumptionVersionId: body.version.id })
  })

  it('writes Ng onto a site with an audit record, and refuses a site with no flashes counted', async () => {
    const refused = await analyst.post(`/api/calibrations/${calibrationId}/site-flash-densities`, { siteIds: [farSiteId] })
    expect(refused.status).toBe(400)
    expect((await refused.json()).statusMessage).toMatch(/^Far away terminal: a flash density of 0 flashes\/km²\/yr cannot be applied/)
    const res = await analyst.post(`/api/calibrations/${calibrationId}/site-flash-densities`, { siteIds: [siteId] })
    expect(res.status).toBe(200)
    const site = (await pool.query(`SELECT flash_density_per_km2_yr, thunderstorm_days_per_yr FROM sites WHERE id = $1`, [siteId])).rows[0]
    expect(site.thunderstorm_days_per_yr).toBeNull()
    expect(site.flash_density_per_km2_yr).toBe((await res.json()).sites[0].flashDensity)
    const audit = (await pool.query(`SELECT before, after FROM audit_events WHERE entity = 'site' AND entity_id = $1`, [siteId])).rows[0]
    expect(audit.before).toEqual({ flashDensityPerKm2Yr: null, thunderstormDaysPerYr: 60 })
    expect(audit.after.fromCalibration).toBe(calibrationId)
  })

  it('gives back the source file exactly as uploaded', async () => {
    const res = await viewer.get(`/api/calibrations/${calibrationId}/source`)
    expect(res.status).toBe(200)
    expect(await res.text()).toBe(records)
  })
})

describe('impulse test records', () => {
  // The hand-worked series of tests/unit/calibration/impulse.test.ts: up-and-down U50 = 92.8 kV.
  const levels = [90, 92, 94, 92, 94, 92, 90, 92, 94, 92, 94, 96, 94, 92, 94, 92, 94, 92, 90, 92, 94, 92]
  const sparks = 'NNSNSSNNSNNSSNSNSSNNSN'
  const series = levels.map((levelKv, i) => ({ levelKv, spark: sparks[i] === 'S' }))
  const base = { title: 'Float switch, rig A', componentClass: 'sharp_device', configuration: 'float 20 mm from wall, 1.2/50 µs, negative', equivalenceFactor: 0.8, equivalenceBasis: 'laboratory comparison of waveshapes (stated by the test house)' }

  it('refuses an empty series and stores nothing', async () => {
    const res = await analyst.post('/api/calibrations/impulse', { ...base, series: [] })
    expect(res.status).toBe(400)
    expect(JSON.stringify(await res.json())).toContain('The series is empty')
    expect(await count('calibrations')).toBe(1)
  })

  it('shows both methods and saves U50 × equivalence factor and σ into a new version', async () => {
    const res = await analyst.post('/api/calibrations/impulse', { ...base, series })
    expect(res.status).toBe(201)
    const c = await res.json()
    expect(c.results.upAndDown.u50Kv).toBeCloseTo(92.8, 10) // worked by hand (IEC 60060-1 mean of the valid levels)
    expect(c.results.field.upAndDownU50Kv).toBeCloseTo(92.8 * 0.8, 10)
    expect(c.results.likelihood.sigma).toBeGreaterThan(0)
    const applied = await analyst.post(`/api/calibrations/${c.id}/assumption-version`, { assumptionVersionId: versionId, method: 'up_and_down' })
    expect(applied.status).toBe(201)
    const v = await applied.json()
    expect(v.version.version).toBe(3)
    expect(v.values['thresholds.sharp_device.u50Kv']).toBeCloseTo(74.24, 10) // 92.8 kV × 0.8
    expect(v.values['thresholds.sharp_device.sigma']).toBe(Number(c.results.likelihood.sigma.toPrecision(4)))
    expect(v.provenance['thresholds.sharp_device.u50Kv'].detail).toMatch(/equivalence factor 0.8/)
    const stored = (await pool.query(`SELECT parameters FROM assumption_set_versions WHERE id = $1`, [v.version.id])).rows[0].parameters
    const entry = (path: string) => stored.uncertainty.entries.find((e: { path: string }) => e.path === path)
    // U50 and σ carry the likelihood covariance (the up-and-down mean has no standard error of its own); other classes keep theirs.
    expect(entry('thresholds.sharp_device.u50Kv')).toMatchObject({ basis: 'calibration', distribution: { kind: 'lognormal', median: v.values['thresholds.sharp_device.u50Kv'] } })
    expect(entry('thresholds.sharp_device.u50Kv').note).toMatch(/up-and-down U50 .*maximum-likelihood one of the same series/)
    expect(entry('thresholds.sharp_device.sigma')).toMatchObject({ basis: 'calibration', distribution: { kind: 'normal', mean: v.values['thresholds.sharp_device.sigma'] } })
    expect(stored.uncertainty.correlations).toContainEqual({ a: 'thresholds.sharp_device.u50Kv', b: 'thresholds.sharp_device.sigma', rho: expect.any(Number) })
    expect(entry('thresholds.grounded_pipe.u50Kv').basis).toBe('illustrative')
    const source = await (await analyst.get(`/api/calibrations/${c.id}/source`)).text()
    expect(source.split('\n')[1]).toBe('90,no')
  })

  it('keeps a series too short for up-and-down, saying why, when likelihood can still use it', async () => {
    const res = await analyst.post('/api/calibrations/impulse', { ...base, title: 'Short series', series: series.slice(0, 15) })
    expect(res.status).toBe(201)
    const c = await res.json()
    expect(c.results.upAndDown).toBeNull()
    expect(c.results.upAndDownProblem).toMatch(/^Only 13 useful applications/)
    const refused = await analyst.post(`/api/calibrations/${c.id}/assumption-version`, { assumptionVersionId: versionId, method: 'up_and_down' })
    expect(refused.status).toBe(409)
  })
})
