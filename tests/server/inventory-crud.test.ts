// Inventory routes per role, across organisations, and through read-only portfolio shares.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ALL_ROLES, createOrganisation, memberClient, type Client, type RoleName } from '../support/accounts'
import { testPool } from '../support/db'

const pool = testPool()
afterAll(() => pool.end())

const SITE = { externalId: 'CR-1', name: 'Crud Flat Battery', operatorName: 'Crud operator', latitudeDeg: 32.2, longitudeDeg: -102.1, flashDensityPerKm2Yr: 5.1 }
const TANK = {
  externalId: 'CR-1-T1', tag: 'TK-1', material: 'frp', heightM: 6, diameterM: 3.5, xM: 0, yM: 0, contents: 'condensate', flammableVapourSpace: true,
  components: [{ componentClass: 'sharp_device', count: 1, heightM: 5 }], replacementValue: 90000,
}

let orgA: string
let orgB: string
const clients: Partial<Record<RoleName, Client>> = {}
let outsiderAnalyst: Client
let outsiderViewer: Client

beforeAll(async () => {
  orgA = await createOrganisation(pool, 'Crud Owner Operator')
  orgB = await createOrganisation(pool, 'Crud Receiving Insurer', 'insurer')
  for (const role of ALL_ROLES) clients[role] = await memberClient(pool, orgA, role)
  outsiderAnalyst = await memberClient(pool, orgB, 'analyst')
  outsiderViewer = await memberClient(pool, orgB, 'viewer')
})

async function json<T = Record<string, unknown>>(res: Response, status: number): Promise<T> {
  const text = await res.text()
  expect(res.status, text).toBe(status)
  return JSON.parse(text) as T
}

describe('CRUD per role (PRODUCT.md roles: analysts and admins edit; others read)', () => {
  let siteId: string
  let tankId: string

  it('editors create; readers get 403 and nothing is written', async () => {
    for (const role of ['underwriter', 'asset_manager', 'viewer'] as const) {
      expect((await clients[role]!.post('/api/sites', { ...SITE, externalId: `X-${role}` })).status).toBe(403)
    }
    siteId = (await json<{ id: string }>(await clients.analyst!.post('/api/sites', SITE), 201)).id
    await json(await clients.admin!.post('/api/sites', { ...SITE, externalId: 'CR-2', name: 'Crud Second' }), 201)
    const { rows } = await pool.query(`SELECT count(*)::int AS n FROM sites WHERE organisation_id = $1`, [orgA])
    expect(rows[0].n).toBe(2) // the two editor creations above
    tankId = (await json<{ id: string }>(await clients.analyst!.post(`/api/sites/${siteId}/tanks`, TANK), 201)).id
    await json(await clients.analyst!.post(`/api/sites/${siteId}/structures`, { externalId: 'M1', kind: 'mast', xM: 20, yM: 5, heightM: 25, radiusM: 0.5 }), 201)
  })

  it('everyone reads the site with its tanks and structures', async () => {
    for (const role of ALL_ROLES) {
      const site = await json<{ tanks: { id: string, components: unknown[] }[], structures: unknown[], readOnly: boolean }>(await clients[role]!.get(`/api/sites/${siteId}`), 200)
      expect(site.tanks.map(t => t.id)).toEqual([tankId])
      expect(site.tanks[0]!.components).toEqual([{ componentClass: 'sharp_device', count: 1, heightM: 5 }]) // as created above
      expect(site.structures).toHaveLength(1)
      expect(site.readOnly).toBe(false)
    }
  })

  it('validation errors come back by field; duplicates are a 409', async () => {
    const bad = await json<{ data: { fields: Record<string, string> } }>(await clients.analyst!.post(`/api/sites/${siteId}/tanks`, { ...TANK, externalId: 'T2', tag: 'TK-2', heightM: -1 }), 400)
    expect(Object.keys(bad.data.fields)).toContain('heightM')
    const both = await json<{ data: { fields: Record<string, string> } }>(await clients.analyst!.post('/api/sites', { ...SITE, externalId: 'CR-3', thunderstormDaysPerYr: 40 }), 400)
    expect(Object.keys(both.data.fields)).toContain('thunderstormDaysPerYr') // a site has Ng or Td, exactly one (issue, item 1)
    expect((await clients.analyst!.post(`/api/sites/${siteId}/tanks`, { ...TANK, externalId: 'T3' })).status).toBe(409) // tag TK-1 is taken on this site
  })

  it('editors change and delete; readers get 403', async () => {
    expect((await clients.viewer!.patch(`/api/tanks/${tankId}`, { ...TANK, heightM: 7 })).status).toBe(403)
    expect((await clients.underwriter!.delete(`/api/tanks/${tankId}`)).status).toBe(403)
    const updated = await json<{ heightM: number }>(await clients.admin!.patch(`/api/tanks/${tankId}`, { ...TANK, heightM: 7 }), 200)
    expect(updated.heightM).toBe(7)
    await json(await clients.analyst!.patch(`/api/sites/${siteId}`, { ...SITE, name: 'Crud Flat Battery North' }), 200)
    const audit = await pool.query(`SELECT action, entity FROM audit_events WHERE organisation_id = $1 AND entity = 'tank' ORDER BY at`, [orgA])
    expect(audit.rows.map(r => r.action)).toEqual(['create', 'update']) // every change is audited (PRODUCT.md capability 9)
  })

  it('deleting a site deletes its tanks, components and structures', async () => {
    const res = await json<{ removed: { tanks: number, structures: number } }>(await clients.analyst!.delete(`/api/sites/${siteId}`), 200)
    expect(res.removed).toEqual({ tanks: 1, structures: 1 }) // what this describe block created
    const { rows } = await pool.query(`SELECT (SELECT count(*)::int FROM tanks WHERE site_id = $1) AS t, (SELECT count(*)::int FROM tank_components c JOIN tanks t ON t.id = c.tank_id WHERE t.site_id = $1) AS c`, [siteId])
    expect(rows[0]).toEqual({ t: 0, c: 0 })
  })
})

describe('another organisation and read-only shares', () => {
  let portfolioId: string
  let sharedSite: string
  let privateSite: string
  let sharedTank: string

  beforeAll(async () => {
    const analyst = clients.analyst!
    sharedSite = (await json<{ id: string }>(await analyst.post('/api/sites', { ...SITE, externalId: 'SH-1', name: 'Shared Flat' }), 201)).id
    privateSite = (await json<{ id: string }>(await analyst.post('/api/sites', { ...SITE, externalId: 'SH-2', name: 'Private Flat' }), 201)).id
    sharedTank = (await json<{ id: string }>(await analyst.post(`/api/sites/${sharedSite}/tanks`, { ...TANK, externalId: 'SH-1-T1' }), 201)).id
    portfolioId = (await json<{ id: string }>(await analyst.post('/api/portfolios', { name: 'Crud fleet' }), 201)).id
    await json(await analyst.post(`/api/portfolios/${portfolioId}/sites`, { add: [sharedSite] }), 200)
  })

  it('before sharing, the other organisation gets 404 on every row, reading or writing', async () => {
    for (const path of [`/api/sites/${sharedSite}`, `/api/tanks/${sharedTank}`, `/api/portfolios/${portfolioId}`]) {
      expect((await outsiderAnalyst.get(path)).status).toBe(404)
    }
    expect((await outsiderAnalyst.patch(`/api/sites/${sharedSite}`, SITE)).status).toBe(404)
    expect((await outsiderAnalyst.delete(`/api/tanks/${sharedTank}`)).status).toBe(404)
    const list = await json<{ total: number }>(await outsiderAnalyst.get('/api/sites'), 200)
    expect(list.total).toBe(0)
  })

  it('only admins share; analysts get 403', async () => {
    expect((await clients.analyst!.post(`/api/portfolios/${portfolioId}/shares`, { organisationName: 'Crud Receiving Insurer' })).status).toBe(403)
    await json(await clients.admin!.post(`/api/portfolios/${portfolioId}/shares`, { organisationName: 'Crud Receiving Insurer' }), 201)
  })

  it('after sharing, the other organisation reads the portfolio, its sites and tanks, and cannot change them', async () => {
    const portfolios = await json<{ id: string, readOnly: boolean }[]>(await outsiderViewer.get('/api/portfolios'), 200)
    expect(portfolios).toEqual([expect.objectContaining({ id: portfolioId, readOnly: true, siteCount: 1 })]) // one site was added to it above
    const site = await json<{ readOnly: boolean, tanks: unknown[] }>(await outsiderViewer.get(`/api/sites/${sharedSite}`), 200)
    expect(site.readOnly).toBe(true)
    expect(site.tanks).toHaveLength(1)
    await json(await outsiderViewer.get(`/api/tanks/${sharedTank}`), 200)
    const list = await json<{ items: { id: string }[] }>(await outsiderViewer.get(`/api/sites?portfolioId=${portfolioId}`), 200)
    expect(list.items.map(s => s.id)).toEqual([sharedSite])
    expect((await outsiderViewer.get(`/api/sites/${privateSite}`)).status).toBe(404) // not in the shared portfolio

    const before = await pool.query(`SELECT name FROM sites WHERE id = $1`, [sharedSite])
    expect((await outsiderAnalyst.patch(`/api/sites/${sharedSite}`, { ...SITE, externalId: 'SH-1', name: 'Hijacked' })).status).toBe(403)
    expect((await outsiderAnalyst.delete(`/api/sites/${sharedSite}`)).status).toBe(403)
    expect((await outsiderAnalyst.post(`/api/sites/${sharedSite}/tanks`, { ...TANK, externalId: 'X', tag: 'X' })).status).toBe(403)
    expect((await outsiderAnalyst.patch(`/api/tanks/${sharedTank}`, { ...TANK, heightM: 9 })).status).toBe(403)
    expect((await outsiderAnalyst.delete(`/api/portfolios/${portfolioId}`)).status).toBe(403)
    expect((await outsiderAnalyst.post(`/api/portfolios/${portfolioId}/sites`, { remove: [sharedSite] })).status).toBe(403)
    const after = await pool.query(`SELECT name FROM sites WHERE id = $1`, [sharedSite])
    expect(after.rows).toEqual(before.rows) // never a change (issue, item 1)
    const tanks = await pool.query(`SELECT count(*)::int AS n FROM tanks WHERE site_id = $1`, [sharedSite])
    expect(tanks.rows[0].n).toBe(1)
  })

  it('a portfolio cannot take another organisation\'s site', async () => {
    const own = (await json<{ id: string }>(await outsiderAnalyst.post('/api/portfolios', { name: 'Insurer book' }), 201)).id
    expect((await outsiderAnalyst.post(`/api/portfolios/${own}/sites`, { add: [sharedSite] })).status).toBe(404)
  })

  it('unsharing ends the access', async () => {
    const p = await json<{ shares: { id: string }[] }>(await clients.admin!.get(`/api/portfolios/${portfolioId}`), 200)
    await json(await clients.admin!.delete(`/api/portfolios/${portfolioId}/shares/${p.shares[0]!.id}`), 200)
    expect((await outsiderViewer.get(`/api/sites/${sharedSite}`)).status).toBe(404)
  })
})

describe('site list at 5,000 tanks', () => {
  it('sorts, filters and pages on the server, quickly', async () => {
    const org = await createOrganisation(pool, 'Crud Large Fleet')
    const viewer = await memberClient(pool, org, 'viewer')
    // 500 sites × 10 tanks = 5,000 tanks, the size the issue names.
    await pool.query(`INSERT INTO sites (organisation_id, external_id, name, operator_name, latitude_deg, longitude_deg, flash_density_per_km2_yr)
      SELECT $1, 'L-' || lpad(g::text, 4, '0'), 'Large ' || g, CASE WHEN g % 2 = 0 THEN 'Even operator' ELSE 'Odd operator' END, 32, -102, 2 + (g % 7) FROM generate_series(1, 500) g`, [org])
    await pool.query(`INSERT INTO tanks (site_id, external_id, tag, material, height_m, diameter_m, x_m, y_m, contents, flammable_vapour_space)
      SELECT s.id, 'T' || t, 'TK-' || t, 'frp', 6, 3, t * 8, 0, 'crude', true FROM sites s, generate_series(1, 10) t WHERE s.organisation_id = $1`, [org])
    const { rows } = await pool.query(`SELECT count(*)::int AS n FROM tanks t JOIN sites s ON s.id = t.site_id WHERE s.organisation_id = $1`, [org])
    expect(rows[0].n).toBe(5000)
    await viewer.get('/api/sites') // warm-up
    const t0 = performance.now()
    const page = await json<{ items: { externalId: string, tankCount: number, operatorName: string }[], total: number }>(await viewer.get('/api/sites?sort=externalId&dir=desc&page=2&pageSize=50&operator=Even%20operator'), 200)
    const ms = performance.now() - t0
    expect(page.total).toBe(250) // half of 500 sites are "Even operator"
    expect(page.items).toHaveLength(50)
    expect(page.items[0]!.externalId).toBe('L-0400') // descending even ids: page 1 is 0500…0402, page 2 starts at 0400
    expect(page.items.every(s => s.tankCount === 10 && s.operatorName === 'Even operator')).toBe(true)
    expect(ms).toBeLessThan(1000) // an interactive list answers within a second (common practice)
    const byCount = await json<{ items: { tankCount: number }[] }>(await viewer.get('/api/sites?sort=tankCount&dir=desc&pageSize=5'), 200)
    expect(byCount.items.map(s => s.tankCount)).toEqual([10, 10, 10, 10, 10])
  })
})
