// Assumption uncertainty through the assumption-set routes (issue "How sure are we"): editors write
// it, everyone reads it, invalid ones are refused with a message per dotted field, and a version
// stored before assumptions carried uncertainty stays readable and editable.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { defaultAssumptions, ILLUSTRATIVE_UNCERTAINTY } from '../../shared/engine/index'
import { ALL_ROLES, createOrganisation, memberClient, type Client, type RoleName } from '../support/accounts'
import { testPool } from '../support/db'

const pool = testPool()
afterAll(() => pool.end())

let org: string
const clients = {} as Record<RoleName, Client>

const own = {
  entries: [
    { path: 'thresholds.grounded_pipe.u50Kv', distribution: { kind: 'lognormal', median: 100, sigmaLn: 0.2 }, basis: 'analyst', note: 'vendor test sheet, ±40 %' },
    { path: 'thresholds.grounded_pipe.sigma', distribution: { kind: 'normal', mean: 0.3, sd: 0.05 }, basis: 'analyst', note: '' },
  ],
  correlations: [{ a: 'thresholds.grounded_pipe.u50Kv', b: 'thresholds.grounded_pipe.sigma', rho: -0.4 }],
}

beforeAll(async () => {
  org = await createOrganisation(pool, 'Uncertainty Test Operator')
  for (const role of ALL_ROLES) clients[role] = await memberClient(pool, org, role)
})

describe('uncertainty through the assumption-set routes', () => {
  let versionId: string

  it('a new set gets the illustrative ranges; an analyst can give its own uncertainty instead', async () => {
    const plain = await clients.analyst.post('/api/assumption-sets', { name: 'Plain', parameters: {} })
    expect(plain.status).toBe(200)
    const plainBody = await plain.json()
    expect(plainBody.version.parameters.uncertainty).toEqual(JSON.parse(JSON.stringify(ILLUSTRATIVE_UNCERTAINTY)))

    const res = await clients.analyst.post('/api/assumption-sets', { name: 'Own ranges', parameters: { uncertainty: own } })
    expect(res.status).toBe(200)
    versionId = (await res.json()).version.id
    const read = await (await clients.viewer.get(`/api/assumption-versions/${versionId}`)).json()
    expect(read.version.parameters.uncertainty).toEqual(own)
  })

  it('refuses an invalid uncertainty with a message at its dotted path, and stores nothing', async () => {
    const bad = { entries: [{ path: 'ignitionGivenSpark.crude', distribution: { kind: 'uniform', min: 0.1, max: 1.4 }, basis: 'analyst', note: '' }], correlations: [] }
    const res = await clients.analyst.patch(`/api/assumption-versions/${versionId}`, { parameters: { uncertainty: bad } })
    expect(res.status).toBe(400)
    const body = await res.json()
    expect(body.data.fields['uncertainty.entries.0.distribution.max']).toMatch(/upper bound of Ignition given a spark, crude oil \(1\.4\) lies outside its valid range \[0, 1\]/)
    const read = await (await clients.viewer.get(`/api/assumption-versions/${versionId}`)).json()
    expect(read.version.parameters.uncertainty).toEqual(own)
  })

  it('only editors write it (PRODUCT.md roles: analysts and admins edit); every role reads it', async () => {
    const change = { parameters: { uncertainty: { entries: [own.entries[0]], correlations: [] } } }
    for (const role of ALL_ROLES) {
      const res = await clients[role].patch(`/api/assumption-versions/${versionId}`, change)
      expect(res.status, role).toBe(role === 'admin' || role === 'analyst' ? 200 : 403)
      const read = await clients[role].get(`/api/assumption-versions/${versionId}`)
      expect(read.status, role).toBe(200)
    }
    const read = await (await clients.viewer.get(`/api/assumption-versions/${versionId}`)).json()
    expect(read.version.parameters.uncertainty).toEqual({ entries: [own.entries[0]], correlations: [] })
  })

  it('a version stored before uncertainty existed reads as stored and, edited, takes the illustrative ranges of the values still at their defaults', async () => {
    const { uncertainty: _u, ...old } = structuredClone(defaultAssumptions) as Record<string, unknown>
    const set = await pool.query(`INSERT INTO assumption_sets (organisation_id, name) VALUES ($1, 'Old set') RETURNING id`, [org])
    const version = await pool.query(`INSERT INTO assumption_set_versions (assumption_set_id, version, parameters) VALUES ($1, 1, $2) RETURNING id`, [set.rows[0].id, JSON.stringify(old)])
    const id = version.rows[0].id
    const read = await clients.viewer.get(`/api/assumption-versions/${id}`)
    expect(read.status).toBe(200)
    expect((await read.json()).version.parameters.uncertainty).toBeUndefined()
    const edited = await clients.analyst.patch(`/api/assumption-versions/${id}`, { parameters: { vapourControlFactor: 0.5 } })
    expect(edited.status).toBe(200)
    const stored = (await pool.query(`SELECT parameters FROM assumption_set_versions WHERE id = $1`, [id])).rows[0].parameters
    const paths = stored.uncertainty.entries.map((e: { path: string }) => e.path)
    expect(paths).not.toContain('vapourControlFactor') // its value is no longer the default 0.3
    expect(paths).toHaveLength(ILLUSTRATIVE_UNCERTAINTY.entries.length - 1)
  })
})
