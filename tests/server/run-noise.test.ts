// Run comparison against simulation noise, and one interval rule per kind of figure (issue 15).
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { defaultAssumptions } from '../../shared/engine/assumptions'
import { garwoodInterval } from '../../shared/engine/statistics'
import { createOrganisation, memberClient, type Client } from '../support/accounts'
import { testPool } from '../support/db'
import { waitForRun } from '../support/runs'
import { createDefaultAssumptions, createFleet } from '../support/fleet'

const pool = testPool()
let analyst: Client
let portfolioId: string
let versionId: string

async function run(body: Record<string, unknown>): Promise<string> {
  const res = await analyst.post('/api/runs', { portfolioId, assumptionVersionId: versionId, chunkSize: 3, ...body })
  expect(res.status).toBe(201)
  const { id } = await res.json()
  expect((await waitForRun(analyst, id)).state).toBe('succeeded')
  return id
}

beforeAll(async () => {
  const org = await createOrganisation(pool, 'Noise Test Insurer', 'insurer')
  analyst = await memberClient(pool, org, 'analyst')
  portfolioId = await createFleet(pool, org, { sites: 8, tanksPerSite: 2, seed: 'noise-test' })
  versionId = await createDefaultAssumptions(pool, org, defaultAssumptions)
}, 120_000)
afterAll(() => pool.end())

interface Noise { verdict: string, z: number | null }

describe('comparing runs against simulation noise', () => {
  it('two runs that differ only by seed: (nearly) every change is within noise', async () => {
    const a = await run({ mode: 'frequency', seed: 101, targetRse: 0.05 })
    const b = await run({ mode: 'frequency', seed: 202, targetRse: 0.05 })
    const res = await analyst.get(`/api/runs/compare?a=${a}&b=${b}`)
    expect(res.status).toBe(200)
    const c = await res.json()
    expect(c.noiseBasis).toBe('independent')
    const verdicts: Noise[] = [
      ...c.sites.flatMap((s: { noise: { ignition: Noise, eal: Noise } }) => [s.noise.ignition, s.noise.eal]),
      ...Object.values(c.totalsNoise as Record<string, Noise>),
    ]
    expect(verdicts).toHaveLength(8 * 2 + 4)
    for (const v of verdicts) expect(['within_noise', 'exceeds_noise']).toContain(v.verdict)
    // With honest standard errors each change exceeds 1.96 SE with probability 5 %. Site ids (and so the
    // random streams) are new on every test run, so the count varies from run to run: of 20 rows, 6 or
    // more exceed by chance with probability 3.3e-4 (binomial B(20, 0.05), hand-worked), while standard
    // errors half their honest size would make about half the rows exceed.
    expect(verdicts.filter(v => v.verdict === 'exceeds_noise').length).toBeLessThanOrEqual(5)
  }, 300_000)

  it('the same inputs and seed twice: results are identical, and said to be', async () => {
    const a = await run({ mode: 'frequency', seed: 303, targetRse: 0.1 })
    const b = await run({ mode: 'frequency', seed: 303, targetRse: 0.1 })
    const c = await (await analyst.get(`/api/runs/compare?a=${a}&b=${b}`)).json()
    expect(c.noiseBasis).toBe('same_inputs_and_seed')
    for (const s of c.sites) expect(s.noise.ignition.verdict).toBe('identical') // bit-reproducible engine (README)
  }, 300_000)
})

describe('simulated years: counts are whole numbers with Garwood intervals at every level', () => {
  it('tank, site and portfolio counts add up and carry the exact Poisson interval', async () => {
    const Y = 2000
    const id = await run({ mode: 'year', years: Y, seed: 7 })
    const { rows: tanks } = await pool.query(`SELECT site_id, direct_count, ignition_count, ignition_lo, ignition_hi FROM run_tank_results WHERE run_id = $1`, [id])
    const { rows: sites } = await pool.query(`SELECT site_id, direct_count, ignition_count, ignition_rate, ignition_lo, ignition_hi FROM run_site_results WHERE run_id = $1`, [id])
    const { rows: [portfolio] } = await pool.query(`SELECT ignition_count, ignition_rate, ignition_lo, ignition_hi FROM run_portfolio_results WHERE run_id = $1`, [id])
    const check = (row: { ignition_count: string | number, ignition_lo: number, ignition_hi: number }) => {
      const n = Number(row.ignition_count)
      expect(Number.isInteger(n)).toBe(true)
      const g = garwoodInterval(n) // tied to Garwood's (1936) table in tests/reference/published-values.test.ts
      expect(row.ignition_lo).toBeCloseTo(g.lo / Y, 12)
      expect(row.ignition_hi).toBeCloseTo(g.hi / Y, 12)
    }
    for (const t of tanks) check(t)
    for (const s of sites) {
      check(s)
      const own = tanks.filter(t => t.site_id === s.site_id)
      expect(Number(s.ignition_count)).toBe(own.reduce((n, t) => n + Number(t.ignition_count), 0)) // counts over the same years add (common practice)
      expect(Number(s.direct_count)).toBe(own.reduce((n, t) => n + Number(t.direct_count), 0))
    }
    check(portfolio)
    expect(Number(portfolio.ignition_count)).toBe(sites.reduce((n, s) => n + Number(s.ignition_count), 0))
    expect(portfolio.ignition_rate).toBeCloseTo(Number(portfolio.ignition_count) / Y, 15) // count / years (common practice)
  }, 300_000)
})
