// Saved what-if options on the server (issue "Screens a practitioner reads at a glance": saved options
// vanished on reload; add "Send to capital plan"): kept per organisation with the run, site and tank,
// listed, removed, audited, and sent to the capital plan as one candidate action.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { defaultAssumptions } from '../../shared/engine/assumptions'
import { defaultWhatIfParams } from '../../shared/results/whatif-params'
import { createOrganisation, memberClient, type Client } from '../support/accounts'
import { testPool } from '../support/db'
import { createDefaultAssumptions, createFleet } from '../support/fleet'

const pool = testPool()
let org: string
let analyst: Client
let manager: Client
let viewer: Client
let runId: string
let siteId: string
let tank: { id: string, tag: string, x_m: number, y_m: number, diameter_m: number }

const figures = { sparkingPerYear: 0.012, directPerYear: 0.0021, ignitionPerYear: 0.0034 }
const body = (o: Record<string, unknown> = {}) => ({
  label: 'Shield rated 60 kA',
  runId, siteId, tankId: tank.id,
  params: { ...defaultWhatIfParams, shieldKa: 60 },
  changes: [{ key: 'shieldKa', label: 'Induced-sparking shield rating', from: 0, to: 60, unit: 'kA' }],
  figures, baselineFigures: { ...figures, sparkingPerYear: 0.03 }, engineVersion: '2.0.0', ...o,
})

beforeAll(async () => {
  org = await createOrganisation(pool, 'What-if Options Operator')
  analyst = await memberClient(pool, org, 'analyst')
  manager = await memberClient(pool, org, 'asset_manager')
  viewer = await memberClient(pool, org, 'viewer')
  const portfolioId = await createFleet(pool, org, { sites: 1, tanksPerSite: 2, seed: 'whatif-options' })
  const versionId = await createDefaultAssumptions(pool, org, defaultAssumptions)
  const { rows: [site] } = await pool.query(`SELECT site_id FROM portfolio_sites WHERE portfolio_id = $1`, [portfolioId])
  siteId = site.site_id
  const { rows: tanks } = await pool.query(`SELECT id, tag, x_m, y_m, diameter_m FROM tanks WHERE site_id = $1 ORDER BY tag`, [siteId])
  tank = tanks[0]
  // A finished run whose snapshot holds the site and its tanks (arranged directly; the what-if reads only the snapshot's tanks).
  const { rows: [run] } = await pool.query(
    `INSERT INTO runs (organisation_id, portfolio_id, portfolio_name, name, assumption_version_id, mode, seed, target_rse, max_samples_per_tank, years,
      chunk_size, sites_total, tanks_total, chunks_total, input_hash, engine_version, state, finished_at)
     VALUES ($1, $2, 'What-if fleet', 'What-if run', $3, 'frequency', 1, 0.2, 4000, 1000, 1, 1, 2, 1, 'x', 'test', 'succeeded', now()) RETURNING id`, [org, portfolioId, versionId])
  runId = run.id
  await pool.query(`INSERT INTO run_site_snapshots (run_id, site_id, position, site, facts) VALUES ($1, $2, 0, $3, '{}')`,
    [runId, siteId, JSON.stringify({ id: siteId, name: 'Generated site 1', flashDensity: 4, tanks: tanks.map(t => ({ id: t.id, tag: t.tag })), structures: [] })])
})
afterAll(() => pool.end())

async function catalogue(kind: string) {
  const res = await manager.get('/api/capital/options')
  const { options } = await res.json() as { options: { id: string, kind: string, name: string }[] }
  return options.find(o => o.kind === kind)!
}

describe('saved what-if options', () => {
  it('are kept with the run’s tank, listed for every member (of that site when asked), and audited; viewers do not save', async () => {
    const res = await analyst.post('/api/whatif-options', body())
    expect(res.status, await res.clone().text()).toBe(201)
    const saved = await res.json()
    expect(saved).toMatchObject({ label: 'Shield rated 60 kA', tankId: tank.id, tankTag: tank.tag, runName: 'What-if run', figures, sentAction: null })
    expect((await viewer.post('/api/whatif-options', body())).status).toBe(403)
    const ofSite = await (await viewer.get(`/api/whatif-options?runId=${runId}&siteId=${siteId}`)).json() as { id: string }[]
    expect(ofSite.map(o => o.id)).toEqual([saved.id])
    const elsewhere = await (await viewer.get(`/api/whatif-options?runId=${runId}&siteId=00000000-0000-4000-8000-000000000009`)).json()
    expect(elsewhere).toEqual([])
    const { rows } = await pool.query(`SELECT after FROM audit_events WHERE entity = 'whatif_option' AND entity_id = $1 AND action = 'create'`, [saved.id])
    expect(rows[0].after).toMatchObject({ label: 'Shield rated 60 kA', tank: tank.tag, changes: ['Induced-sparking shield rating: 0 → 60'] })
  })

  it('refuses a tank that is not in the run, and a site without its run, beside the field', async () => {
    expect((await analyst.post('/api/whatif-options', body({ tankId: '00000000-0000-4000-8000-000000000001' }))).status).toBe(404)
    const res = await analyst.post('/api/whatif-options', body({ runId: null }))
    expect(res.status).toBe(400)
    expect((await res.json()).data.fields.runId).toBe('A run, its site and its tank go together.')
  })

  it('a shield option goes to the capital plan in one step, priced by the catalogue, once', async () => {
    const saved = await (await analyst.post('/api/whatif-options', body({ label: 'Shield for the plan' }))).json()
    const shield = await catalogue('shield')
    expect((await analyst.post(`/api/whatif-options/${saved.id}/send`, { optionId: shield.id })).status).toBe(403)
    const res = await manager.post(`/api/whatif-options/${saved.id}/send`, { optionId: shield.id })
    expect(res.status, await res.clone().text()).toBe(201)
    const { actionId, option } = await res.json()
    // Starter catalogue (server/capital/catalogue.ts): 6,000 + 2,500 per m of diameter, rounded up to whole 100s.
    const expectedCost = Math.ceil((6000 + 2500 * tank.diameter_m) / 100) * 100
    expect(option.sentAction).toMatchObject({ id: actionId, optionName: shield.name, cost: expectedCost })
    const actions = await (await manager.get('/api/capital/actions')).json() as { actions?: { id: string, tankId: string }[] } | { id: string, tankId: string }[]
    const list = Array.isArray(actions) ? actions : actions.actions ?? []
    expect(list.find(a => a.id === actionId)?.tankId).toBe(tank.id)
    const again = await manager.post(`/api/whatif-options/${saved.id}/send`, { optionId: shield.id })
    expect(again.status).toBe(409)
    const { rows } = await pool.query(`SELECT after FROM audit_events WHERE entity = 'capital_action' AND entity_id = $1`, [actionId])
    expect(rows[0].after).toMatchObject({ option: shield.name, tank: tank.tag, fromWhatIf: 'Shield for the plan' })
  })

  it('a mast stands at the what-if’s distance due east of the tank’s axis', async () => {
    const saved = await (await analyst.post('/api/whatif-options', body({ label: 'Mast 25 m at 18 m', params: { ...defaultWhatIfParams, mastHeightM: 25, mastDistanceM: 18 } }))).json()
    const mast = await catalogue('mast')
    const res = await manager.post(`/api/whatif-options/${saved.id}/send`, { optionId: mast.id })
    expect(res.status, await res.clone().text()).toBe(201)
    const { actionId } = await res.json()
    const { rows: [row] } = await pool.query(`SELECT site_id, tank_id, mast_x_m, mast_y_m FROM capital_actions WHERE id = $1`, [actionId])
    // East is +x on the site plan (tanks.x_m: metres east of the reference point): x + 18, y unchanged.
    expect(row).toEqual({ site_id: siteId, tank_id: null, mast_x_m: tank.x_m + 18, mast_y_m: tank.y_m })
  })

  it('an option saved without a run’s tank cannot go to the plan; removing an option keeps its action', async () => {
    const loose = await (await analyst.post('/api/whatif-options', body({ runId: null, siteId: null, tankId: null, label: '' }))).json()
    // The label is written from the changes when none is given.
    expect(loose.label).toBe('Induced-sparking shield rating 60 kA')
    const shield = await catalogue('shield')
    expect((await manager.post(`/api/whatif-options/${loose.id}/send`, { optionId: shield.id })).status).toBe(409)
    const [sent] = (await (await viewer.get(`/api/whatif-options?runId=${runId}`)).json() as { id: string, sentAction: { id: string } | null }[]).filter(o => o.sentAction)
    expect((await viewer.delete(`/api/whatif-options/${sent!.id}`)).status).toBe(403)
    expect((await analyst.delete(`/api/whatif-options/${sent!.id}`)).status).toBe(204)
    const { rows } = await pool.query(`SELECT id FROM capital_actions WHERE id = $1`, [sent!.sentAction!.id])
    expect(rows).toHaveLength(1)
    const { rows: audit } = await pool.query(`SELECT before FROM audit_events WHERE entity = 'whatif_option' AND entity_id = $1 AND action = 'delete'`, [sent!.id])
    expect(audit).toHaveLength(1)
  })
})
