// Storms that hit several sites (issue 21) through the routes: the storm clustering calibration from an
// uploaded records file into an assumption version, and the accumulation view of a hand-made run.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { defaultAssumptions } from '../../shared/engine/assumptions'
import { createOrganisation, memberClient, type Client } from '../support/accounts'
import { testPool } from '../support/db'
import { createDefaultAssumptions, createFleet } from '../support/fleet'
import { insertHandMadeRun } from '../support/insurance'
import { thomasRecordsCsv } from '../support/thomas-records'

const pool = testPool()
afterAll(() => pool.end())

let org: string
let otherOrg: string
let analyst: Client
let viewer: Client
let underwriter: Client
let stranger: Client
let portfolioId: string
let versionId: string
let sites: string[]

beforeAll(async () => {
  org = await createOrganisation(pool, 'Clustering Test Operator')
  otherOrg = await createOrganisation(pool, 'Someone Else Entirely')
  ;[analyst, viewer, underwriter, stranger] = await Promise.all([memberClient(pool, org, 'analyst'), memberClient(pool, org, 'viewer'), memberClient(pool, org, 'underwriter'), memberClient(pool, otherOrg, 'admin')])
  portfolioId = await createFleet(pool, org, { sites: 3, tanksPerSite: 1, seed: 'accumulation-test', name: 'Clustering fleet' })
  versionId = await createDefaultAssumptions(pool, org, defaultAssumptions)
  sites = (await pool.query(`SELECT site_id FROM portfolio_sites WHERE portfolio_id = $1 ORDER BY site_id`, [portfolioId])).rows.map(r => r.site_id)
})

describe('storm clustering calibration', () => {
  // Truth: σ = 8 km, 150 flashes per storm, 4 storms a day in a ≈ 300 × 300 km box, 40 days.
  const box = { minLat: 30, maxLat: 32.7, minLon: -97, maxLon: -93.9 }
  let fileId: string
  let calibrationId: string

  it('fits σ and flashes per storm from an uploaded file, with bootstrap intervals', async () => {
    const csv = thomasRecordsCsv({ box, days: 40, stormsPerDay: 4, flashesPerStorm: 150, spreadKm: 8, seed: 21 })
    const up = await fetch(`${inject('baseUrl')}/api/calibrations/lightning-files?name=thomas.csv`, { method: 'POST', headers: { cookie: analyst.cookie, 'content-type': 'text/csv' }, body: csv })
    expect(up.status).toBe(201)
    fileId = (await up.json()).id
    const input = { title: 'Synthetic storms', fileId, box, windowHours: 24, detectionEfficiency: 1, recordsAre: 'flashes', bootstrap: 19 }
    expect((await viewer.post('/api/calibrations/storm-clustering', input)).status).toBe(403)
    expect((await underwriter.post('/api/calibrations/storm-clustering', input)).status).toBe(403)
    expect((await stranger.post('/api/calibrations/storm-clustering', input)).status).toBe(404) // another organisation's file
    const res = await analyst.post('/api/calibrations/storm-clustering', input)
    expect(res.status).toBe(201)
    const row = await res.json()
    calibrationId = row.id
    expect(row.kind).toBe('storm_clustering')
    // Stated tolerance: 15 % on σ, 30 % on μ for 40 windows of about four storms (the unit test's bootstrap spread).
    expect(row.results.spreadKm / 8).toBeGreaterThan(0.85)
    expect(row.results.spreadKm / 8).toBeLessThan(1.15)
    expect(row.results.flashesPerStorm / 150).toBeGreaterThan(0.7)
    expect(row.results.flashesPerStorm / 150).toBeLessThan(1.3)
    expect(row.results.intervals.spreadKm.lo).toBeLessThan(row.results.spreadKm)
    expect(row.results.intervals.spreadKm.hi).toBeGreaterThan(row.results.spreadKm)
    expect(row.results.edgeCorrection).toMatch(/translation/)
    const audit = await pool.query(`SELECT after FROM audit_events WHERE organisation_id = $1 AND entity = 'calibration' AND entity_id = $2`, [org, calibrationId])
    expect(audit.rows[0].after.kind).toBe('storm_clustering')
  })

  it('refuses a region with too few flashes in words', async () => {
    const res = await analyst.post('/api/calibrations/storm-clustering', { title: 'Empty corner', fileId, box: { minLat: 10, maxLat: 11, minLon: 10, maxLon: 11 }, detectionEfficiency: 1, recordsAre: 'flashes', bootstrap: 19 })
    expect(res.status).toBe(400)
    expect((await res.json()).statusMessage).toMatch(/No time window holds two or more ground flashes/)
  })

  it('saves σ and flashes per storm into a new assumption version with provenance', async () => {
    expect((await viewer.post(`/api/calibrations/${calibrationId}/assumption-version`, { assumptionVersionId: versionId })).status).toBe(403)
    const res = await analyst.post(`/api/calibrations/${calibrationId}/assumption-version`, { assumptionVersionId: versionId, note: 'Synthetic storms' })
    expect(res.status).toBe(201)
    const body = await res.json()
    const stored = (await pool.query(`SELECT parameters, provenance FROM assumption_set_versions WHERE id = $1`, [body.version.id])).rows[0]
    const calibration = (await (await viewer.get(`/api/calibrations/${calibrationId}`)).json()).results
    // Rounded to four significant figures (server/calibration/apply.ts, as the other calibrations).
    expect(stored.parameters.stormClustering.spreadKm).toBe(Number(calibration.spreadKm.toPrecision(4)))
    expect(stored.parameters.stormClustering.flashesPerStorm).toBe(Number(calibration.flashesPerStorm.toPrecision(4)))
    expect(stored.provenance['stormClustering.spreadKm'].calibrationId).toBe(calibrationId)
    expect(stored.provenance['stormClustering.spreadKm'].unit).toBe('km')
    expect(stored.provenance['stormClustering.flashesPerStorm'].interval.confidence).toBe(0.95)
    expect(stored.provenance['stormClustering.spreadKm'].method).toMatch(/minimum contrast/)
    // The estimates carry their bootstrap interval as an uncertainty: a normal whose central 95 % is
    // as wide as the interval (mean ± 1.96 sd, the normal's 97.5 % point — common practice).
    const spread = stored.parameters.uncertainty.entries.find((e: { path: string }) => e.path === 'stormClustering.spreadKm')
    const interval = stored.provenance['stormClustering.spreadKm'].interval
    expect(spread.basis).toBe('calibration')
    expect(spread.distribution.kind).toBe('normal')
    expect(spread.distribution.mean).toBe(stored.parameters.stormClustering.spreadKm)
    expect(2 * 1.959964 * spread.distribution.sd / (interval.hi - interval.lo)).toBeCloseTo(1, 2)
    expect(stored.parameters.uncertainty.entries.some((e: { path: string }) => e.path === 'stormClustering.flashesPerStorm')).toBe(true)
    // The rest of the set is the base version's.
    expect(stored.parameters.lognormalMedianKa).toBe(defaultAssumptions.lognormalMedianKa)
  })
})

describe('accumulation view', () => {
  let runId: string

  beforeAll(async () => {
    // 1,000 years: sites 0 and 1 lose in years 0–19 (100 and 50 each year), site 2 loses 1 in years 500–519.
    const ab = Array.from({ length: 20 }, (_, y) => y)
    runId = await insertHandMadeRun(pool, {
      organisationId: org, portfolioId, assumptionVersionId: versionId, years: 1000,
      siteEvents: { [sites[0]!]: ab.map(y => [y, 100]), [sites[1]!]: ab.map(y => [y, 50]), [sites[2]!]: ab.map(y => [500 + y, 1]) },
      names: { [sites[0]!]: 'North tank farm', [sites[1]!]: 'South terminal', [sites[2]!]: 'Inland depot' },
    })
  })

  it('finds the two sites that lose together, for every role that reads results', async () => {
    for (const client of [viewer, underwriter, analyst]) {
      const res = await client.get(`/api/runs/${runId}/accumulation`)
      expect(res.status).toBe(200)
      const body = await res.json()
      expect(body.available).toBe(true)
      // T = 100 ⇒ 10 worst years (⌊1,000/100⌋), each 150: 1,500 in all (hand-worked).
      expect(body.worstYears).toHaveLength(10)
      expect(body.worstYearsLoss).toBe(1500)
      expect(body.groups).toHaveLength(1)
      expect([...body.groups[0].names].sort()).toEqual(['North tank farm', 'South terminal'])
      expect(body.groups[0].allTogetherYears).toBe(10)
      const byName = Object.fromEntries(body.sites.map((s: { name: string }) => [s.name, s]))
      expect(byName['North tank farm'].share).toBeCloseTo(2 / 3, 12)
      expect(byName['Inland depot'].share).toBe(0)
      expect(byName['Inland depot'].group).toBeNull()
    }
  })

  it('takes the return period from the query and checks it', async () => {
    // T = 50 ⇒ 20 worst years: all of years 0–19.
    const body = await (await viewer.get(`/api/runs/${runId}/accumulation?returnPeriodYears=50`)).json()
    expect(body.worstYears).toHaveLength(20)
    const bad = await viewer.get(`/api/runs/${runId}/accumulation?returnPeriodYears=1`)
    expect(bad.status).toBe(400)
    expect((await bad.json()).data.fields.returnPeriodYears).toMatch(/at least 2 years/)
  })

  it('answers 404 to another organisation and says when a run has no simulated years', async () => {
    expect((await stranger.get(`/api/runs/${runId}/accumulation`)).status).toBe(404)
    const frequencyRun = await insertHandMadeRun(pool, { organisationId: org, portfolioId, assumptionVersionId: versionId, years: 10, siteEvents: { [sites[0]!]: [] } })
    await pool.query(`UPDATE runs SET mode = 'frequency' WHERE id = $1`, [frequencyRun])
    const body = await (await viewer.get(`/api/runs/${frequencyRun}/accumulation`)).json()
    expect(body.available).toBe(false)
    expect(body.sites).toEqual([])
  })
})
