// The dashboard and site-list answers are stored documents (server/results/documents.ts): built once
// (at the run's end or on first read, under a lock), equal to a fresh build, rebuilt when stale.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { defaultAssumptions } from '../../shared/engine/assumptions'
import { createOrganisation, memberClient, type Client } from '../support/accounts'
import { testDb, testPool } from '../support/db'
import { waitForRun } from '../support/runs'
import { createDefaultAssumptions, createFleet } from '../support/fleet'

// The server modules below read the test database through their own pool.
process.env.STORMLEDGER_DB_NAME = inject('dbName')
process.env.DATABASE_URL = ''
const { closeDb, useDb } = await import('../../server/db')
const { documentVersion, storedDocument } = await import('../../server/results/documents')
const { dashboardView, siteListView } = await import('../../server/results/views')
const { findSucceededRun } = await import('../../server/results/queries')

const pool = testPool()
let org: string
let viewer: Client
let runId: string

beforeAll(async () => {
  org = await createOrganisation(pool, 'Documents Test Operator')
  await pool.query(`UPDATE organisations SET currency = 'EUR' WHERE id = $1`, [org])
  const analyst = await memberClient(pool, org, 'analyst')
  viewer = await memberClient(pool, org, 'viewer')
  const portfolioId = await createFleet(pool, org, { sites: 5, tanksPerSite: 2, seed: 'documents-test' })
  const versionId = await createDefaultAssumptions(pool, org, defaultAssumptions)
  const res = await analyst.post('/api/runs', { portfolioId, assumptionVersionId: versionId, mode: 'frequency', targetRse: 0.2, seed: 7, chunkSize: 2 })
  runId = (await res.json()).id
  expect((await waitForRun(analyst, runId)).state).toBe('succeeded')
}, 300_000)
afterAll(async () => {
  await closeDb()
  await pool.end()
})

const storedRow = async (view: string) => (await pool.query(`SELECT version, body FROM run_result_documents WHERE run_id = $1 AND view = $2 AND currency = 'EUR'`, [runId, view])).rows[0]

describe('stored result documents', () => {
  it('the routes answer the stored document, and it equals a fresh build from the stored results', async () => {
    const run = (await findSucceededRun(org, runId))!
    for (const [view, build] of [['dashboard', () => dashboardView(run, 'EUR')], ['sites', () => siteListView(run, 'EUR')]] as const) {
      const res = await viewer.get(`/api/runs/${runId}/${view}`)
      expect(res.status).toBe(200)
      const answer = await res.json()
      const row = await storedRow(view)
      expect(row.version).toBe(documentVersion({ engineVersion: run.engineVersion, view }))
      expect(JSON.parse(row.body)).toEqual(answer)
      // A fresh build, serialised the same way the route does (JSON of the view).
      expect(row.body).toBe(JSON.stringify(await build()))
    }
  })

  it('a document of another version is rebuilt on its next read, then read as stored', async () => {
    const run = (await findSucceededRun(org, runId))!
    await pool.query(`UPDATE run_result_documents SET version = '0.0.0/dashboard.0', body = '{"stale":true}' WHERE run_id = $1 AND view = 'dashboard'`, [runId])
    let builds = 0
    const key = { runId, engineVersion: run.engineVersion, view: 'dashboard' as const, currency: 'EUR' }
    const build = () => { builds += 1; return dashboardView(run, 'EUR') }
    const body = await storedDocument(useDb(), key, build)
    expect(builds).toBe(1)
    expect(body).toBe(JSON.stringify(await dashboardView(run, 'EUR')))
    expect((await storedRow('dashboard')).version).toBe(documentVersion(key))
    expect(await storedDocument(useDb(), key, build)).toBe(body)
    expect(builds).toBe(1)
  })

  it('simultaneous first reads from two connection pools build the document once', async () => {
    const run = (await findSucceededRun(org, runId))!
    await pool.query(`DELETE FROM run_result_documents WHERE run_id = $1 AND view = 'sites'`, [runId])
    let builds = 0
    const build = async () => {
      builds += 1
      await new Promise(r => setTimeout(r, 300)) // long enough for every reader to be waiting on the lock
      return siteListView(run, 'EUR')
    }
    const key = { runId, engineVersion: run.engineVersion, view: 'sites' as const, currency: 'EUR' }
    const otherPool = testPool()
    const other = testDb(otherPool)
    try {
      const bodies = await Promise.all([
        ...Array.from({ length: 4 }, () => storedDocument(useDb(), key, build)),
        ...Array.from({ length: 2 }, () => storedDocument(other, key, build)),
      ])
      expect(builds).toBe(1)
      expect(new Set(bodies).size).toBe(1)
      expect(bodies[0]).toBe(JSON.stringify(await siteListView(run, 'EUR')))
      expect((await pool.query(`SELECT count(*)::int AS n FROM run_result_documents WHERE run_id = $1 AND view = 'sites'`, [runId])).rows[0].n).toBe(1)
    } finally {
      await otherPool.end()
    }
  })

  it('another organisation does not see the run through the stored document', async () => {
    const stranger = await memberClient(pool, await createOrganisation(pool, 'Documents Other Operator'), 'viewer')
    expect((await stranger.get(`/api/runs/${runId}/dashboard`)).status).toBe(404)
    expect((await stranger.get(`/api/runs/${runId}/sites`)).status).toBe(404)
  })
})
