// Archiving and deleting assumption sets, calibrations, mitigation options and policy-terms sets
// (issue 13, point 11): archived records are hidden by default and shown on request; deleting is
// refused with the reason while a run in progress uses a record, and once a run used it; every
// change is audited.
import { gzipSync } from 'node:zlib'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { defaultAssumptions } from '../../shared/engine/assumptions'
import { createOrganisation, memberClient, type Client } from '../support/accounts'
import { testPool } from '../support/db'
import { createDefaultAssumptions, createFleet } from '../support/fleet'

const pool = testPool()
let org: string
let analyst: Client
let planner: Client
let underwriter: Client
let portfolioId: string
afterAll(() => pool.end())

beforeAll(async () => {
  org = await createOrganisation(pool, 'Archive Test Operator')
  analyst = await memberClient(pool, org, 'analyst')
  planner = await memberClient(pool, org, 'asset_manager')
  underwriter = await memberClient(pool, org, 'underwriter')
  portfolioId = await createFleet(pool, org, { sites: 1, tanksPerSite: 1, seed: 'archive-test' })
})

async function insertRun(versionId: string, state: 'queued' | 'succeeded'): Promise<string> {
  const { rows: [run] } = await pool.query(
    `INSERT INTO runs (organisation_id, portfolio_id, portfolio_name, assumption_version_id, mode, seed, target_rse, max_samples_per_tank, years,
      chunk_size, sites_total, tanks_total, chunks_total, input_hash, engine_version, state)
     VALUES ($1, $2, 'Archive fleet', $3, 'frequency', 1, 0.2, 4000, 1000, 1, 1, 1, 1, 'x', 'test', $4) RETURNING id`, [org, portfolioId, versionId, state])
  return run.id
}

async function audited(entity: string, id: string): Promise<string[]> {
  const { rows } = await pool.query(`SELECT action FROM audit_events WHERE entity = $1 AND entity_id = $2 ORDER BY at`, [entity, id])
  return rows.map(r => r.action)
}

async function setIdOf(versionId: string): Promise<string> {
  return (await pool.query(`SELECT assumption_set_id FROM assumption_set_versions WHERE id = $1`, [versionId])).rows[0].assumption_set_id
}

const idsIn = (list: { id: string }[]) => list.map(x => x.id)

describe('assumption sets', () => {
  it('archive hides a set (shown with ?archived=include), a run cannot start from it, restore brings it back', async () => {
    const versionId = await createDefaultAssumptions(pool, org, defaultAssumptions)
    const setId = await setIdOf(versionId)
    const archived = await analyst.post(`/api/assumption-sets/${setId}/archive`, { archived: true })
    expect(archived.status, await archived.clone().text()).toBe(200)
    expect(idsIn(await (await analyst.get('/api/assumption-sets')).json())).not.toContain(setId)
    const all = await (await analyst.get('/api/assumption-sets?archived=include')).json() as { id: string, archivedAt: string | null }[]
    expect(all.find(s => s.id === setId)?.archivedAt).toBeTruthy()
    const start = await analyst.post('/api/runs', { portfolioId, assumptionVersionId: versionId, mode: 'frequency' })
    expect(start.status).toBe(409)
    expect((await start.json()).statusMessage).toMatch(/is archived/)
    expect((await analyst.post(`/api/assumption-sets/${setId}/archive`, { archived: false })).status).toBe(200)
    expect(idsIn(await (await analyst.get('/api/assumption-sets')).json())).toContain(setId)
    expect(await audited('assumption_set', setId)).toEqual(['archive', 'restore'])
  })

  it('archive and delete are refused while a run in progress uses the set; delete stays refused once a run used it', async () => {
    const versionId = await createDefaultAssumptions(pool, org, defaultAssumptions)
    const setId = await setIdOf(versionId)
    const runId = await insertRun(versionId, 'queued')
    const archive = await analyst.post(`/api/assumption-sets/${setId}/archive`, { archived: true })
    expect(archive.status).toBe(409)
    expect((await archive.json()).statusMessage).toMatch(/1 run in progress uses this assumption set/)
    await pool.query(`UPDATE runs SET state = 'succeeded' WHERE id = $1`, [runId])
    const del = await analyst.delete(`/api/assumption-sets/${setId}`)
    expect(del.status).toBe(409)
    expect((await del.json()).statusMessage).toMatch(/1 run and 0 scenario evaluations used this assumption set.*Archive the set instead/)
    expect((await analyst.post(`/api/assumption-sets/${setId}/archive`, { archived: true })).status).toBe(200)
    // The finished run still reads.
    expect((await analyst.get(`/api/runs/${runId}`)).status).toBe(200)
  })

  it('an unused set is deleted with its versions, and the deletion is audited', async () => {
    const versionId = await createDefaultAssumptions(pool, org, defaultAssumptions)
    const setId = await setIdOf(versionId)
    expect((await analyst.delete(`/api/assumption-sets/${setId}`)).status).toBe(204)
    expect((await pool.query(`SELECT count(*)::int AS n FROM assumption_set_versions WHERE id = $1`, [versionId])).rows[0].n).toBe(0)
    expect(await audited('assumption_set', setId)).toEqual(['delete'])
    expect((await analyst.delete(`/api/assumption-sets/${setId}`)).status).toBe(404)
  })
})

describe('calibrations', () => {
  async function calibration(): Promise<string> {
    const text = 'level_kv,spark\n90,no\n92,yes\n'
    const { rows: [file] } = await pool.query(`INSERT INTO calibration_files (organisation_id, kind, file_name, byte_size, row_count, sha256, content_gzip, summary)
      VALUES ($1, 'impulse', 'series.csv', $2, 2, 'x', $3, '{}') RETURNING id`, [org, Buffer.byteLength(text), gzipSync(text)])
    const { rows: [row] } = await pool.query(`INSERT INTO calibrations (organisation_id, kind, title, file_id, inputs, results) VALUES ($1, 'impulse', 'Series A', $2, '{}', '{}') RETURNING id`, [org, file.id])
    return row.id
  }

  it('archive hides, restore shows; an unused calibration is deleted', async () => {
    const id = await calibration()
    expect((await analyst.post(`/api/calibrations/${id}/archive`, {})).status).toBe(200)
    expect(idsIn(await (await analyst.get('/api/calibrations')).json())).not.toContain(id)
    expect(idsIn(await (await analyst.get('/api/calibrations?archived=only')).json())).toEqual([id])
    expect((await analyst.delete(`/api/calibrations/${id}`)).status).toBe(204)
    expect(await audited('calibration', id)).toEqual(['archive', 'delete'])
  })

  it('delete is refused when a run used an assumption version made from the calibration', async () => {
    const id = await calibration()
    const versionId = await createDefaultAssumptions(pool, org, defaultAssumptions)
    await pool.query(`INSERT INTO calibration_applications (organisation_id, calibration_id, target, assumption_version_id, values) VALUES ($1, $2, 'assumption_version', $3, '{}')`, [org, id, versionId])
    await insertRun(versionId, 'succeeded')
    const del = await analyst.delete(`/api/calibrations/${id}`)
    expect(del.status).toBe(409)
    expect((await del.json()).statusMessage).toMatch(/1 run used an assumption version made from this calibration/)
  })
})

describe('mitigation options', () => {
  it('archive hides an option and refuses new actions with it; delete is refused while a saved plan includes its actions', async () => {
    const { options } = await (await planner.get('/api/capital/options')).json() as { options: { id: string, name: string }[] }
    const option = options[0]!
    expect((await planner.post(`/api/capital/options/${option.id}/archive`, { archived: true })).status).toBe(200)
    const after = await (await planner.get('/api/capital/options')).json() as { options: { id: string }[] }
    expect(idsIn(after.options)).not.toContain(option.id)
    const add = await planner.post('/api/capital/actions', { optionId: option.id, filter: {} })
    expect(add.status).toBe(409)
    const { rows: [tank] } = await pool.query(`SELECT t.id, t.site_id FROM tanks t JOIN portfolio_sites ps ON ps.site_id = t.site_id WHERE ps.portfolio_id = $1 LIMIT 1`, [portfolioId])
    const { rows: [action] } = await pool.query(`INSERT INTO capital_actions (organisation_id, option_id, site_id, tank_id, cost) VALUES ($1, $2, $3, $4, 1000) RETURNING id`, [org, option.id, tank.site_id, tank.id])
    const { rows: [plan] } = await pool.query(`INSERT INTO capital_plans (organisation_id, name, budget, metric, action_ids, total_cost, reduction) VALUES ($1, 'Plan A', 5000, 'loss', $2, 1000, 1) RETURNING id`, [org, JSON.stringify([action.id])])
    const del = await planner.delete(`/api/capital/options/${option.id}`)
    expect(del.status).toBe(409)
    expect((await del.json()).statusMessage).toMatch(/1 saved plan includes actions of this option/)
    expect((await planner.delete(`/api/capital/plans/${plan.id}`)).status).toBe(204)
    expect((await planner.delete(`/api/capital/options/${option.id}`)).status).toBe(204)
    expect(await audited('mitigation_option', option.id)).toEqual(['archive', 'delete'])
  })
})

describe('policy-terms sets', () => {
  it('archived terms are hidden and not recorded by new runs; delete is refused once a run used them', async () => {
    const versionId = await createDefaultAssumptions(pool, org, defaultAssumptions)
    const created = await underwriter.post('/api/policy-terms', { portfolioId, name: 'Terms A' })
    expect(created.status, await created.clone().text()).toBe(200)
    const setId = (await created.json()).set.id as string
    expect((await underwriter.post(`/api/policy-terms/${setId}/archive`, { archived: true })).status).toBe(200)
    expect(idsIn(await (await underwriter.get('/api/policy-terms')).json())).not.toContain(setId)
    expect(idsIn(await (await underwriter.get('/api/policy-terms?archived=include')).json())).toContain(setId)
    const start = await analyst.post('/api/runs', { portfolioId, assumptionVersionId: versionId, mode: 'frequency', targetRse: 0.2, maxSamplesPerTank: 4000 })
    expect(start.status, await start.clone().text()).toBe(201)
    const runId = (await start.json()).id as string
    expect((await pool.query(`SELECT count(*)::int AS n FROM run_terms WHERE run_id = $1`, [runId])).rows[0].n).toBe(0)
    // A run that recorded them (inserted as a run's start would) makes them undeletable.
    const { rows: [version] } = await pool.query(`SELECT id FROM policy_terms_versions WHERE terms_set_id = $1 ORDER BY version DESC LIMIT 1`, [setId])
    const usedBy = await insertRun(versionId, 'succeeded')
    await pool.query(`INSERT INTO run_terms (run_id, terms_version_id) VALUES ($1, $2)`, [usedBy, version.id])
    const del = await underwriter.delete(`/api/policy-terms/${setId}`)
    expect(del.status).toBe(409)
    expect((await del.json()).statusMessage).toMatch(/1 run used these terms/)
    expect(await audited('policy_terms', setId)).toEqual(['create', 'archive'])
  })

  it('unused terms are deleted', async () => {
    const other = await createFleet(pool, org, { sites: 1, tanksPerSite: 1, seed: 'archive-test-2' })
    const created = await underwriter.post('/api/policy-terms', { portfolioId: other, name: 'Terms B' })
    const setId = (await created.json()).set.id as string
    expect((await underwriter.delete(`/api/policy-terms/${setId}`)).status).toBe(204)
    expect((await underwriter.get(`/api/policy-terms/${setId}`)).status).toBe(404)
  })
})
