// After the storm (issue 22) through the routes, the queue and the worker, against the real database:
// feed tokens, idempotent and all-or-nothing batches, the report's figures, alerts by e-mail.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { createMember, createOrganisation, memberClient, type Client, TEST_PASSWORD, Client as SessionClient } from '../support/accounts'
import { testPool } from '../support/db'
import { waitForMail } from '../support/mail'

const pool = testPool()
afterAll(() => pool.end())

const SITE = { lat: 31.5, lon: -102.0 }
const HEADER = 'time,latitude,longitude,peak_current_ka,type,location_error_km'
// Tank T-1 at the site's reference point; a flash exactly on its axis (error 0) with 60 kA.
const ON_AXIS = `2026-06-14T21:10:00.000Z,${SITE.lat.toFixed(6)},${SITE.lon.toFixed(6)},-60.0,ground,0`
const FAR = `2026-06-14T21:12:00.000Z,${(SITE.lat + 0.5).toFixed(6)},${SITE.lon.toFixed(6)},-30.0,ground,0.2`
const CLOUD = '2026-06-14T21:13:00.000Z,31.6,-102.1,-8.0,cloud,'
// Values of T-1 (invented test inputs) and the default mean damage ratios (README "Loss model":
// replacement 0.7, contents 0.8, clean-up 0.6, interruption 0.6).
const VALUES = { replacement: 200_000, contents: 100_000, cleanup: 50_000, interruption: 80_000 }
const FIRE_PD = 0.7 * 200_000 + 0.8 * 100_000 + 0.6 * 50_000 // hand-worked: 250,000
const FIRE_BI = 0.6 * 80_000 // hand-worked: 48,000

let org: string
let admin: Client, analyst: Client, underwriter: Client, viewer: Client
let manager: { client: Client, email: string }
let token: string
let siteId: string, tankId: string

async function postFeed(body: string, bearer = token): Promise<Response> {
  return fetch(`${inject('baseUrl')}/api/storms/feed`, { method: 'POST', headers: { 'content-type': 'text/csv', authorization: `Bearer ${bearer}` }, body })
}
const flashes = async () => Number((await pool.query(`SELECT count(*)::int AS n FROM storm_flashes WHERE organisation_id = $1`, [org])).rows[0].n)
const batches = async () => Number((await pool.query(`SELECT count(*)::int AS n FROM storm_batches WHERE organisation_id = $1`, [org])).rows[0].n)

async function waitForBatches(timeoutMs = 30_000) {
  const until = Date.now() + timeoutMs
  while (Date.now() < until) {
    const { rows } = await pool.query(`SELECT count(*)::int AS n FROM storm_batches WHERE organisation_id = $1 AND state <> 'processed'`, [org])
    if (rows[0].n === 0) return
    await new Promise(r => setTimeout(r, 250))
  }
  throw new Error('storm batches were not processed in time')
}

beforeAll(async () => {
  org = await createOrganisation(pool, 'Storm Test Operator')
  admin = await memberClient(pool, org, 'admin')
  analyst = await memberClient(pool, org, 'analyst')
  underwriter = await memberClient(pool, org, 'underwriter')
  viewer = await memberClient(pool, org, 'viewer')
  const m = await createMember(pool, org, 'asset_manager')
  const c = new SessionClient()
  await c.signIn(m.email, TEST_PASSWORD)
  manager = { client: c, email: m.email }
  const site = await pool.query(`INSERT INTO sites (organisation_id, external_id, name, latitude_deg, longitude_deg, flash_density_per_km2_yr) VALUES ($1, 'ST-1', 'Ridge tank battery', $2, $3, 4) RETURNING id`, [org, SITE.lat, SITE.lon])
  siteId = site.rows[0].id
  const tank = await pool.query(`INSERT INTO tanks (site_id, external_id, tag, material, height_m, diameter_m, x_m, y_m, contents, flammable_vapour_space, replacement_value, contents_value, cleanup_cost, interruption_cost)
    VALUES ($1, 'T-1', 'T-1', 'frp', 8, 4, 0, 0, 'condensate', true, $2, $3, $4, $5) RETURNING id`, [siteId, VALUES.replacement, VALUES.contents, VALUES.cleanup, VALUES.interruption])
  tankId = tank.rows[0].id
  await pool.query(`INSERT INTO tank_components (tank_id, component_class, count, height_m) VALUES ($1, 'sharp_device', 1, 6)`, [tankId])
  const portfolio = await pool.query(`INSERT INTO portfolios (organisation_id, name) VALUES ($1, 'Storm fleet') RETURNING id`, [org])
  await pool.query(`INSERT INTO portfolio_sites (portfolio_id, site_id) VALUES ($1, $2)`, [portfolio.rows[0].id, siteId])
  const set = await pool.query(`INSERT INTO policy_terms_sets (organisation_id, portfolio_id, name) VALUES ($1, $2, 'Storm fleet terms') RETURNING id`, [org, portfolio.rows[0].id])
  const version = await pool.query(`INSERT INTO policy_terms_versions (terms_set_id, version) VALUES ($1, 1) RETURNING id`, [set.rows[0].id])
  await pool.query(`INSERT INTO policy_site_terms (version_id, site_id, occurrence_deductible, interruption_deductible, share) VALUES ($1, $2, 50000, 8000, 0.5)`, [version.rows[0].id, siteId])
})

describe('feeds and alert settings', () => {
  it('an admin creates a feed and sees its token once; only its hash is stored', async () => {
    const res = await admin.post('/api/storms/feeds', { name: 'Test provider' })
    expect(res.status).toBe(201)
    const body = await res.json() as { token: string, tokenHint: string }
    token = body.token
    expect(token.length).toBeGreaterThan(40)
    const { rows } = await pool.query(`SELECT token_hash FROM storm_feeds WHERE organisation_id = $1`, [org])
    expect(rows[0].token_hash).not.toContain(token)
    const list = await (await admin.get('/api/storms/feeds')).text()
    expect(list).not.toContain(token)
  })

  it('the threshold is the admin’s, the subscription each reader’s', async () => {
    expect((await analyst.request('PUT', '/api/storms/alert-settings', { ignitionThreshold: 0.1 })).status).toBe(403)
    expect((await admin.request('PUT', '/api/storms/alert-settings', { ignitionThreshold: 1.5 })).status).toBe(400)
    expect((await admin.request('PUT', '/api/storms/alert-settings', { ignitionThreshold: 0.05 })).status).toBe(200)
    expect((await manager.client.request('PUT', '/api/storms/alert-subscription', { subscribed: true })).status).toBe(200)
    const settings = await (await manager.client.get('/api/storms/alert-settings')).json() as { ignitionThreshold: number, subscribed: boolean }
    expect(settings).toMatchObject({ ignitionThreshold: 0.05, subscribed: true })
  })
})

describe('the feed endpoint', () => {
  it('refuses a missing or unknown token', async () => {
    expect((await postFeed(`${HEADER}\n${FAR}\n`, 'not-a-token')).status).toBe(401)
    const res = await fetch(`${inject('baseUrl')}/api/storms/feed`, { method: 'POST', headers: { 'content-type': 'text/csv' }, body: `${HEADER}\n${FAR}\n` })
    expect(res.status).toBe(401)
  })

  it('refuses a batch with a bad line whole, naming the line', async () => {
    const res = await postFeed(`${HEADER}\n${FAR}\n2026-06-14T21:20:00Z,95.0,-102.0,-20,ground,0.1\n${CLOUD}\n`)
    expect(res.status).toBe(400)
    const body = await res.json() as { message: string, data: { lineErrors: { line: number, message: string }[] } }
    expect(body.data.lineErrors).toHaveLength(1)
    expect(body.data.lineErrors[0]!.line).toBe(3)
    expect(body.data.lineErrors[0]!.message).toContain('latitude')
    expect(await batches()).toBe(0)
    expect(await flashes()).toBe(0)
  })

  it('takes a batch once: posting it again, or overlapping records, leaves one copy of each record', async () => {
    const since = new Date()
    const first = await postFeed(`${HEADER}\n${ON_AXIS}\n${FAR}\n`)
    expect(first.status).toBe(202)
    const a = await first.json() as { id: string, newRecords: number, duplicate: boolean }
    expect(a).toMatchObject({ newRecords: 2, duplicate: false })
    const again = await postFeed(`${HEADER}\n${ON_AXIS}\n${FAR}\n`)
    expect(again.status).toBe(200)
    expect(await again.json()).toMatchObject({ id: a.id, duplicate: true })
    const overlap = await postFeed(`${HEADER}\n${FAR}\n${CLOUD}\n`)
    expect(await overlap.json()).toMatchObject({ newRecords: 1, duplicate: false })
    expect(await flashes()).toBe(3)
    expect(await batches()).toBe(2)
    await waitForBatches()
    // The alert: tank T-1 (P(fire) 0.5) is above the 5 % threshold; the subscriber is e-mailed.
    const mail = await waitForMail(pool, manager.email, since)
    expect(mail.subject).toContain('Storm alert')
    expect(mail.body).toContain('T-1')
    expect(mail.body).toContain('50.0 %')
    expect(mail.body).toMatch(/\/storms\/[0-9a-f-]{36}/)
  })
})

describe('the storm report', () => {
  let windowId: string

  it('one window holds the storm; viewers may not read it', async () => {
    const res = await underwriter.get('/api/storms/windows')
    const list = await res.json() as { id: string, flashCount: number }[]
    expect(list).toHaveLength(1)
    expect(list[0]!.flashCount).toBe(3) // three distinct records, all within the hour gap
    windowId = list[0]!.id
    expect((await viewer.get('/api/storms/windows')).status).toBe(403)
  })

  it('ranks the tank with its probabilities, driving flash and losses', async () => {
    const report = await (await manager.client.get(`/api/storms/windows/${windowId}`)).json() as {
      tanks: { tag: string, direct: number, ignition: number, flashCurrentKa: number, expectedGroundUpLoss: number, expectedInsuredLoss: number }[]
      totals: { expectedFires: number, expectedGroundUpLoss: number, expectedInsuredLoss: number }
      flashes: unknown[], sites: unknown[]
    }
    const t = report.tanks[0]!
    expect(t.tag).toBe('T-1')
    expect(t.direct).toBeCloseTo(1, 9) // flash on the axis, exact location: the tank captures it (MODEL.md §2)
    // P(fire) = 1 − (1 − 0.5)(1 − p_far) with p_far < 1e-12 (55 km away): 0.5, the ignition given a
    // direct strike on a non-conducting tank with a vapour space (MODEL.md §4).
    expect(t.ignition).toBeCloseTo(0.5, 9)
    expect(t.flashCurrentKa).toBe(-60) // the driving flash is the on-axis one
    expect(report.totals.expectedFires).toBeCloseTo(0.5, 9) // Σ P(ignition), one tank
    // Ground-up: 0.5 × (PD 250,000 + BI 48,000) = 149,000 (hand-worked; one tank, no spread).
    expect(report.totals.expectedGroundUpLoss).toBeCloseTo(0.5 * (FIRE_PD + FIRE_BI), 2)
    // Insured: share 0.5 × ((250,000 − 50,000) + (48,000 − 8,000)) = 120,000 per fire; × 0.5 = 60,000 (hand-worked).
    expect(report.totals.expectedInsuredLoss).toBeCloseTo(0.5 * 0.5 * ((FIRE_PD - 50_000) + (FIRE_BI - 8_000)), 2)
    expect(report.flashes).toHaveLength(3)
    expect(report.sites).toHaveLength(1)
  })

  it('exports a workbook with the caution; another organisation gets 404', async () => {
    const res = await underwriter.get(`/api/storms/windows/${windowId}/export`)
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toContain('spreadsheetml')
    const ExcelJS = (await import('exceljs')).default
    const wb = new ExcelJS.Workbook()
    await wb.xlsx.load(Buffer.from(await res.arrayBuffer()) as unknown as ArrayBuffer)
    expect(String(wb.getWorksheet('Summary')!.getCell(2, 2).value)).toContain('not a lightning-protection design')
    expect(wb.getWorksheet('Tanks')!.getCell(2, 4).value).toBe('T-1')
    // Units in the headers, probabilities with fixed decimals (never 0.000E+00), money in the currency (issue #18).
    const tanks = wb.getWorksheet('Tanks')!
    const headers = (tanks.getRow(1).values as unknown[]).map(String)
    expect(headers).toContain('P(fire), probability')
    expect(tanks.getCell(2, headers.indexOf('P(fire), probability')).numFmt).toMatch(/^0\.0{2,8}$/)
    expect(headers).toContain('Expected ground-up loss, USD')
    expect(tanks.getCell(2, headers.indexOf('Expected ground-up loss, USD')).numFmt).toBe('#,##0')
    const otherOrg = await createOrganisation(pool, 'Storm Bystander')
    const stranger = await memberClient(pool, otherOrg, 'underwriter')
    expect((await stranger.get(`/api/storms/windows/${windowId}`)).status).toBe(404)
    expect(await (await stranger.get('/api/storms/windows')).json()).toEqual([])
  })

  it('every alert is audited, and a later batch alerts only newly passing tanks', async () => {
    const { rows } = await pool.query(`SELECT action, after FROM audit_events WHERE organisation_id = $1 AND entity = 'storm_alert'`, [org])
    expect(rows).toHaveLength(1)
    expect(rows[0].after.tanks).toBe(1)
    await postFeed(`${HEADER}\n2026-06-14T21:30:00.000Z,${SITE.lat.toFixed(6)},${(SITE.lon + 0.00001).toFixed(6)},-45.0,ground,0\n`)
    await waitForBatches()
    const alerts = await pool.query(`SELECT count(*)::int AS n FROM storm_alerts WHERE organisation_id = $1`, [org])
    expect(alerts.rows[0].n).toBe(1) // T-1 was alerted already in this window
  })
})

describe('uploads', () => {
  it('an analyst uploads a CSV in the calibration format; a viewer may not', async () => {
    const text = `${HEADER}\n2026-07-01T10:00:00Z,${(SITE.lat + 0.001).toFixed(6)},${SITE.lon.toFixed(6)},-35,ground,0.1\n`
    const post = (c: Client) => fetch(`${inject('baseUrl')}/api/storms/uploads?name=july.csv`, { method: 'POST', headers: { cookie: c.cookie, 'content-type': 'text/csv' }, body: text })
    expect((await post(viewer)).status).toBe(403)
    const res = await post(analyst)
    expect(res.status).toBe(202)
    await waitForBatches()
    const list = await (await analyst.get('/api/storms/windows')).json() as unknown[]
    expect(list).toHaveLength(2) // more than an hour after the first storm: a window of its own
  })
})

describe('a worker cut off mid-batch', () => {
  it('leaves one copy of every record and the batch is worked again in full', async () => {
    // Hold the organisation's window lock, so the worker's transaction stops inside the batch; then
    // end that worker's database session (what a killed worker amounts to for PostgreSQL).
    const holder = await pool.connect()
    try {
      await holder.query(`SELECT pg_advisory_lock(hashtext($1))`, [`storm-windows:${org}`])
      const res = await postFeed(`${HEADER}\n2026-08-02T18:00:00.000Z,${SITE.lat.toFixed(6)},${(SITE.lon + 0.002).toFixed(6)},-20.0,ground,0.05\n2026-08-02T18:00:30.000Z,${(SITE.lat + 0.01).toFixed(6)},${SITE.lon.toFixed(6)},-15.0,ground,0.2\n`)
      expect(res.status).toBe(202)
      let waiting: number | null = null
      for (let i = 0; i < 200 && waiting === null; i++) {
        const { rows } = await pool.query(`SELECT pid FROM pg_stat_activity WHERE wait_event_type = 'Lock' AND query LIKE '%pg_advisory_xact_lock%' AND datname = current_database()`)
        if (rows.length) waiting = rows[0].pid
        else await new Promise(r => setTimeout(r, 100))
      }
      expect(waiting, 'the worker never reached the window lock').not.toBeNull()
      await pool.query(`SELECT pg_terminate_backend($1)`, [waiting])
      await new Promise(r => setTimeout(r, 500))
    } finally {
      await holder.query(`SELECT pg_advisory_unlock(hashtext($1))`, [`storm-windows:${org}`]).catch(() => {})
      holder.release()
    }
    await waitForBatches(60_000)
    const { rows } = await pool.query(`SELECT record_key, count(*)::int AS n FROM storm_flashes WHERE organisation_id = $1 GROUP BY record_key HAVING count(*) > 1`, [org])
    expect(rows).toEqual([]) // unique on record identity: one copy each
    const windows = await pool.query(`SELECT w.id, w.flash_count, (SELECT count(*)::int FROM storm_flashes f WHERE f.window_id = w.id) AS n FROM storm_windows w WHERE w.organisation_id = $1 AND w.starts_at >= '2026-08-01'`, [org])
    expect(windows.rows).toHaveLength(1)
    expect(windows.rows[0].flash_count).toBe(2)
    expect(windows.rows[0].n).toBe(2)
    const results = await pool.query(`SELECT count(*)::int AS n FROM storm_tank_results WHERE window_id = $1`, [windows.rows[0].id])
    expect(results.rows[0].n).toBe(1) // the one tank, once
  }, 90_000)
})

describe('portfolios shared with another organisation', () => {
  it('the receiving organisation sees the shared sites’ tanks of the storm, never the owner’s other sites or totals', async () => {
    const other = await pool.query(`INSERT INTO sites (organisation_id, external_id, name, latitude_deg, longitude_deg, flash_density_per_km2_yr) VALUES ($1, 'ST-2', 'Unshared yard', 31.6, -102.2, 4) RETURNING id`, [org])
    await pool.query(`INSERT INTO tanks (site_id, external_id, tag, material, height_m, diameter_m, x_m, y_m, contents, flammable_vapour_space) VALUES ($1, 'T-9', 'T-9', 'frp', 8, 4, 0, 0, 'condensate', true)`, [other.rows[0].id])
    const insurer = await createOrganisation(pool, 'Storm Insurer', 'insurer')
    const portfolio = await pool.query(`SELECT id FROM portfolios WHERE organisation_id = $1 AND name = 'Storm fleet'`, [org])
    await pool.query(`INSERT INTO portfolio_shares (portfolio_id, organisation_id) VALUES ($1, $2)`, [portfolio.rows[0].id, insurer])
    const reader = await memberClient(pool, insurer, 'underwriter')
    await postFeed(`${HEADER}\n2026-09-10T12:00:00.000Z,${SITE.lat.toFixed(6)},${SITE.lon.toFixed(6)},-60.0,ground,0\n2026-09-10T12:01:00.000Z,31.600000,-102.200000,-60.0,ground,0\n`)
    await waitForBatches()
    type Row = { id: string, startsAt: string, expectedFires: number, topIgnition: number, own: boolean }
    const mine = (await (await underwriter.get('/api/storms/windows')).json() as Row[]).find(w => w.startsAt.startsWith('2026-09-10'))!
    expect(mine.expectedFires).toBeCloseTo(1, 9) // two tanks each struck on the axis: 0.5 + 0.5 (MODEL.md §4, hand-worked)
    const theirs = (await (await reader.get('/api/storms/windows')).json() as Row[]).find(w => w.startsAt.startsWith('2026-09-10'))!
    expect(theirs.own).toBe(false)
    expect(theirs.expectedFires).toBeCloseTo(0.5, 9) // the shared site's tank only
    const report = await (await reader.get(`/api/storms/windows/${theirs.id}`)).json() as { tanks: { tag: string, hasTerms: boolean }[], totals: { expectedFires: number, expectedInsuredLoss: number } }
    expect(report.tanks.map(t => t.tag)).toEqual(['T-1'])
    expect(report.totals.expectedFires).toBeCloseTo(0.5, 9)
    expect(report.totals.expectedInsuredLoss).toBe(0) // the insurer has no terms on this portfolio
    expect(report.tanks[0]!.hasTerms).toBe(false)
  })
})
