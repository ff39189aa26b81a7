// After the storm (issue 22) through the routes, the queue and the worker, against the real database:
// feed tokens, idempotent and all-or-nothing batches, the report's figures, alerts by e-mail.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { createMember, createOrganisation, memberClient, type Client, TEST_PASSWORD, Client as SessionClient } from '../support/accounts'
import { testPool } from '../support/db'
import { waitForMail } from '../support/mail'
import { spawnWorker, stopWorker } from '../support/workers'
import jStat from 'jstat'

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
    // The one error contract: data.fields keyed `lines.<n>` (DEVELOPERS.md), and how many lines were bad.
    const body = await res.json() as { message: string, data: { fields: Record<string, string>, errorCount: number } }
    expect(Object.keys(body.data.fields)).toEqual(['lines.3'])
    expect(body.data.fields['lines.3']).toContain('latitude')
    expect(body.data.errorCount).toBe(1)
    expect(body.message).toContain('line 3')
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
      tanks: { tag: string, direct: number, ignition: number, burning: number, flashCurrentKa: number, expectedGroundUpLoss: number }[]
      siteLosses: { terms: string, method: string, expectedInsuredLoss: number, insuredAtRisk: number, valueAtRisk: number }[]
      totals: { expectedFires: number, expectedGroundUpLoss: number, expectedInsuredLoss: number, sitesWithTerms: number, sitesWithoutTerms: number }
      flashes: unknown[], sites: unknown[]
    }
    const t = report.tanks[0]!
    expect(t.tag).toBe('T-1')
    expect(t.direct).toBeCloseTo(1, 9) // flash on the axis, exact location: the tank captures it (MODEL.md §2)
    // P(fire) = 1 − (1 − 0.5)(1 − p_far) with p_far < 1e-12 (55 km away): 0.5, the ignition given a
    // direct strike on a non-conducting tank with a vapour space (MODEL.md §4).
    expect(t.ignition).toBeCloseTo(0.5, 9)
    expect(t.burning).toBeCloseTo(0.5, 9) // one tank: no neighbour to spread from
    expect(t.flashCurrentKa).toBe(-60) // the driving flash is the on-axis one
    expect(report.totals.expectedFires).toBeCloseTo(0.5, 9) // Σ P(ignition), one tank
    // Ground-up: 0.5 × (PD 250,000 + BI 48,000) = 149,000 (hand-worked; one tank, no spread).
    expect(report.totals.expectedGroundUpLoss).toBeCloseTo(0.5 * (FIRE_PD + FIRE_BI), 2)
    // Insured: 0.5 × E[(PD − 50,000)+ + (BI − 8,000)+] × share 0.5 over the beta damage ratios — not the
    // terms on the mean fire (0.5 × 0.5 × 240,000 = 60,000), which understates it.
    const insured = 0.5 * 0.5 * expectedOccurrenceNet(50_000, 8_000)
    expect(insured).toBeGreaterThan(60_000) // E[(X − d)+] ≥ (E[X] − d)+ (Jensen)
    expect(Math.abs(report.totals.expectedInsuredLoss - insured) / insured).toBeLessThan(1e-3) // midpoint rule of 4,096 levels vs 160 Gauss–Legendre nodes
    const site = report.siteLosses[0]!
    expect(site).toMatchObject({ terms: 'current', method: 'exact' })
    expect(site.valueAtRisk).toBe(430_000) // Σ of T-1's values (test inputs above)
    expect(site.insuredAtRisk).toBe(215_000) // × share 0.5, no limit
    expect(report.totals).toMatchObject({ sitesWithTerms: 1, sitesWithoutTerms: 0 })
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
    const sitesSheet = wb.getWorksheet('Sites')!
    expect(sitesSheet.getCell(1, 6).value).toBe('Expected insured loss, USD')
    expect(Number(sitesSheet.getCell(2, 6).value)).toBeGreaterThan(60_000) // the insured expectation of the report above
    expect(String(sitesSheet.getCell(2, 10).value)).toContain('exact')
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

describe('a worker killed mid-batch', () => {
  it('SIGKILL of a real worker process holding a batch: one copy of every record, and the batch completes once a new worker runs', async () => {
    // Hold the organisation's window lock, so a worker's transaction stops inside the batch. Two
    // batches: the app's own worker (one storm batch at a time) takes one, the extra worker the other.
    const doomed = spawnWorker()
    await doomed.ready
    const holder = await pool.connect()
    let fresh: ReturnType<typeof spawnWorker> | null = null
    try {
      await holder.query(`SELECT pg_advisory_lock(hashtext($1))`, [`storm-windows:${org}`])
      for (const minute of ['00', '10']) {
        const res = await postFeed(`${HEADER}\n2026-08-02T18:${minute}:00.000Z,${SITE.lat.toFixed(6)},${(SITE.lon + 0.002).toFixed(6)},-20.0,ground,0.05\n2026-08-02T18:${minute}:30.000Z,${(SITE.lat + 0.01).toFixed(6)},${SITE.lon.toFixed(6)},-15.0,ground,0.2\n`)
        expect(res.status).toBe(202)
      }
      // The heartbeat names the worker (host:pid) that holds each storm batch job.
      let held = false
      for (let i = 0; i < 300 && !held; i++) {
        const { rows } = await pool.query(`SELECT count(*)::int AS n FROM job_heartbeats WHERE queue = 'storm.batch' AND worker LIKE $1
          AND job_id IN (SELECT id FROM pgboss.job WHERE name = 'storm.batch' AND state = 'active')`, [`%:${doomed.workerPid()}`])
        held = rows[0].n > 0
        if (!held) await new Promise(r => setTimeout(r, 100))
      }
      expect(held, `the extra worker never took a storm batch: ${doomed.output().slice(-1000)}`).toBe(true)
      await stopWorker(doomed, 'SIGKILL')
      expect(doomed.child.signalCode ?? doomed.child.exitCode).not.toBeNull()
    } finally {
      await stopWorker(doomed, 'SIGKILL').catch(() => {})
      await holder.query(`SELECT pg_advisory_unlock(hashtext($1))`, [`storm-windows:${org}`]).catch(() => {})
      holder.release()
    }
    try {
      // A new worker: its reaper (like the app worker's) fails the dead worker's job once its beat is stale, and it is worked again.
      fresh = spawnWorker()
      await fresh.ready
      await waitForBatches(90_000)
    } finally {
      if (fresh) await stopWorker(fresh)
    }
    const { rows } = await pool.query(`SELECT record_key, count(*)::int AS n FROM storm_flashes WHERE organisation_id = $1 GROUP BY record_key HAVING count(*) > 1`, [org])
    expect(rows).toEqual([]) // unique on record identity: one copy each
    const windows = await pool.query(`SELECT w.id, w.flash_count, (SELECT count(*)::int FROM storm_flashes f WHERE f.window_id = w.id) AS n FROM storm_windows w WHERE w.organisation_id = $1 AND w.starts_at >= '2026-08-01' AND w.starts_at < '2026-09-01'`, [org])
    expect(windows.rows).toHaveLength(1) // both batches within the hour: one window
    expect(windows.rows[0].flash_count).toBe(4)
    expect(windows.rows[0].n).toBe(4)
    const results = await pool.query(`SELECT count(*)::int AS n FROM storm_tank_results WHERE window_id = $1`, [windows.rows[0].id])
    expect(results.rows[0].n).toBe(1) // the one tank, once
    const states = await pool.query(`SELECT state FROM storm_batches WHERE organisation_id = $1 AND created_at > now() - interval '5 minutes'`, [org])
    expect(states.rows.every((r: { state: string }) => r.state === 'processed')).toBe(true)
  }, 150_000)
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
    type Report = { tanks: { tag: string }[], siteLosses: { siteName: string, terms: string, expectedInsuredLoss: number | null }[], totals: { expectedFires: number, expectedInsuredLoss: number, sites: number, sitesWithTerms: number, sitesWithoutTerms: number } }
    const report = await (await reader.get(`/api/storms/windows/${theirs.id}`)).json() as Report
    expect(report.tanks.map(t => t.tag)).toEqual(['T-1'])
    expect(report.totals.expectedFires).toBeCloseTo(0.5, 9)
    // The insurer has no terms on this portfolio: "no terms", not a loss of 0, and the totals say so.
    expect(report.siteLosses).toEqual([expect.objectContaining({ siteName: 'Ridge tank battery', terms: 'none', expectedInsuredLoss: null })])
    expect(report.totals).toMatchObject({ sites: 1, sitesWithTerms: 0, sitesWithoutTerms: 1 })
    const res = await reader.get(`/api/storms/windows/${theirs.id}/export`)
    expect(res.status).toBe(200)
    const ExcelJS = (await import('exceljs')).default
    const wb = new ExcelJS.Workbook()
    await wb.xlsx.load(Buffer.from(await res.arrayBuffer()) as unknown as ArrayBuffer)
    const sheet = wb.getWorksheet('Sites')!
    expect(sheet.getCell(2, 6).value).toBeNull() // blank, with a note
    expect(sheet.getCell(2, 9).value).toBe('no terms')
    expect(String(sheet.getCell(2, 11).value)).toContain('no terms')
    expect(String(sheet.getCell(2, 11).value)).toContain('not a loss of 0')
  })
})

describe('the feed’s rate limit', () => {
  it('counts every attempt — refused and duplicate posts alike — and answers 429 with Retry-After', async () => {
    const res = await admin.post('/api/storms/feeds', { name: 'Busy provider' })
    const busy = (await res.json() as { token: string }).token
    // 15 duplicates (a batch this organisation already holds) and 15 refused batches: 30 attempts, 0 stored.
    const before = await batches()
    for (let i = 0; i < 15; i++) expect((await postFeed(`${HEADER}\n${ON_AXIS}\n${FAR}\n`, busy)).status).toBe(200)
    for (let i = 0; i < 15; i++) expect((await postFeed(`${HEADER}\n2026-06-14T21:20:00Z,95.0,-102.0,-20,ground,0.1\n`, busy)).status).toBe(400)
    expect(await batches()).toBe(before) // nothing stored: the old limit (stored batches only) would never have stopped this feed
    const over = await postFeed(`${HEADER}\n2027-01-05T10:00:00.000Z,10.000000,10.000000,-5.0,ground,0.1\n`, busy)
    expect(over.status).toBe(429) // the 31st attempt within a minute (FEED_POSTS_PER_MINUTE = 30)
    const retryAfter = Number(over.headers.get('retry-after'))
    expect(retryAfter).toBeGreaterThanOrEqual(1)
    expect(retryAfter).toBeLessThanOrEqual(60)
    const body = await over.json() as { message: string }
    expect(body.message).toMatch(/31 posts in the last minute; it may make 30\. Try again in \d+ s/)
    expect(await batches()).toBe(before)
    // Refused attempts count too: the next one is refused the same way.
    expect((await postFeed(`${HEADER}\n${ON_AXIS}\n`, busy)).status).toBe(429)
    const { rows } = await pool.query(`SELECT count(*)::int AS n FROM storm_feed_attempts a JOIN storm_feeds f ON f.id = a.feed_id WHERE f.token_hash <> '' AND f.name = 'Busy provider' AND f.organisation_id = $1`, [org])
    expect(rows[0].n).toBe(32)
    // Per token: the organisation's other feed is not limited by this one.
    expect((await postFeed(`${HEADER}\n2026-06-14T21:20:00Z,95.0,-102.0,-20,ground,0.1\n`)).status).toBe(400)
  })
})

/**
 * E[(PD − d)+ + (BI − d_BI)+] for T-1 burning: one uniform u drives every component through its beta
 * quantile (jstat; method-of-moments shape from the default means and sds, README "Loss model":
 * replacement 0.7 ± 0.25, contents 0.8 ± 0.25, clean-up 0.6 ± 0.3, interruption 0.6 ± 0.3), integrated
 * over u by composite 4-point Gauss–Legendre on 40 panels (Abramowitz & Stegun 25.4.29 nodes).
 */
function expectedOccurrenceNet(deductible: number, interruptionDeductible: number): number {
  const q = (mean: number, sd: number, u: number) => {
    const k = mean * (1 - mean) / (sd * sd) - 1
    return jStat.beta.inv(u, mean * k, (1 - mean) * k)
  }
  const x = [-0.8611363115940526, -0.3399810435848563, 0.3399810435848563, 0.8611363115940526]
  const w = [0.3478548451374538, 0.6521451548625461, 0.6521451548625461, 0.3478548451374538]
  let e = 0
  for (let p = 0; p < 40; p++) {
    for (let k = 0; k < 4; k++) {
      const u = (p + (x[k]! + 1) / 2) / 40
      const pd = VALUES.replacement * q(0.7, 0.25, u) + VALUES.contents * q(0.8, 0.25, u) + VALUES.cleanup * q(0.6, 0.3, u)
      const bi = VALUES.interruption * q(0.6, 0.3, u)
      e += (w[k]! / 2 / 40) * (Math.max(0, pd - deductible) + Math.max(0, bi - interruptionDeductible))
    }
  }
  return e
}

describe('a storm computed before per-site losses were kept', () => {
  it('still reads: its stored ground-up figure, insured "not computed" (never 0), the totals count it', async () => {
    const list = await (await underwriter.get('/api/storms/windows')).json() as { id: string, startsAt: string }[]
    const june = list.find(w => w.startsAt.startsWith('2026-06-14'))!
    // What a window computed by the former release holds: tank results, no site rows.
    await pool.query(`DELETE FROM storm_site_results WHERE window_id = $1`, [june.id])
    const stored = (await pool.query(`SELECT ignition, fire_loss_property_damage::float8 + fire_loss_interruption::float8 AS fire FROM storm_tank_results WHERE window_id = $1`, [june.id])).rows as { ignition: number, fire: number }[]
    const res = await underwriter.get(`/api/storms/windows/${june.id}`)
    expect(res.status).toBe(200)
    const report = await res.json() as { siteLosses: { terms: string, expectedInsuredLoss: number | null, expectedGroundUpLoss: number }[], totals: { sitesNotComputed: number, sitesWithTerms: number, expectedGroundUpLoss: number } }
    expect(report.siteLosses).toHaveLength(1)
    expect(report.siteLosses[0]).toMatchObject({ terms: 'not computed', expectedInsuredLoss: null })
    // The former convention on the stored columns: Σ P(fire) × the expected loss of a fire starting at the tank.
    expect(report.totals.expectedGroundUpLoss).toBeCloseTo(stored.reduce((s, r) => s + r.ignition * r.fire, 0), 2)
    expect(report.totals).toMatchObject({ sitesNotComputed: 1, sitesWithTerms: 0 })
    expect((await underwriter.get(`/api/storms/windows/${june.id}/export`)).status).toBe(200)
  })
})
