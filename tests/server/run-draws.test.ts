// Runs with assumption draws (issue "How sure are we"): the option, the stored bands and indices,
// reproducibility whatever the chunks, and the refusals.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import ExcelJS from 'exceljs'
import { defaultAssumptions } from '../../shared/engine/assumptions'
import { createOrganisation, memberClient, type Client } from '../support/accounts'
import { testPool } from '../support/db'
import { waitForRun } from '../support/runs'
import { createDefaultAssumptions, createFleet } from '../support/fleet'

const pool = testPool()
let analyst: Client
let viewer: Client
let underwriter: Client
let portfolioId: string
let versionId: string
let plainVersionId: string

const uncertainty = {
  entries: [
    { path: 'flashDensityFactor', distribution: { kind: 'lognormal', median: 1, sigmaLn: 0.3 }, basis: 'illustrative', note: 'test range' },
    { path: 'thresholds.sharp_device.u50Kv', distribution: { kind: 'lognormal', median: 70, sigmaLn: 0.25 }, basis: 'illustrative', note: 'test range' },
    { path: 'thresholds.sharp_device.sigma', distribution: { kind: 'uniform', min: 0.2, max: 0.4 }, basis: 'illustrative', note: 'test range' },
    { path: 'ignitionGivenSpark.condensate', distribution: { kind: 'triangular', min: 0.2, mode: 0.4, max: 0.6 }, basis: 'illustrative', note: 'test range' },
  ],
  correlations: [{ a: 'thresholds.sharp_device.u50Kv', b: 'thresholds.sharp_device.sigma', rho: -0.4 }],
}
const quick = { mode: 'frequency', targetRse: 0.2, maxSamplesPerTank: 4000 } as const

async function start(body: Record<string, unknown>) {
  const res = await analyst.post('/api/runs', { portfolioId, assumptionVersionId: versionId, ...quick, ...body })
  expect(res.status, await res.clone().text()).toBe(201)
  return (await res.json()).id as string
}

beforeAll(async () => {
  const org = await createOrganisation(pool, 'Draws Test Operator')
  analyst = await memberClient(pool, org, 'analyst')
  viewer = await memberClient(pool, org, 'viewer')
  underwriter = await memberClient(pool, org, 'underwriter')
  portfolioId = await createFleet(pool, org, { sites: 5, tanksPerSite: 3, seed: 'draws-test' })
  versionId = await createDefaultAssumptions(pool, org, { ...defaultAssumptions, uncertainty })
  // The defaults carry illustrative ranges; a set whose analyst removed every uncertainty has none to draw.
  plainVersionId = await createDefaultAssumptions(pool, org, { ...defaultAssumptions, uncertainty: { entries: [], correlations: [] } })
})
afterAll(() => pool.end())

describe('runs with assumption draws', () => {
  it('store bands apart from the simulation interval, the same whatever the chunks', async () => {
    const one = await start({ seed: 77, assumptionDraws: 50, chunkSize: 5 })
    const two = await start({ seed: 77, assumptionDraws: 50, chunkSize: 1 })
    expect((await waitForRun(viewer, one)).state).toBe('succeeded')
    expect((await waitForRun(viewer, two)).state).toBe('succeeded')
    const dash = await (await viewer.get(`/api/runs/${one}/dashboard`)).json()
    const bands = dash.assumptionBands
    expect(bands.draws).toBe(50)
    for (const m of ['direct', 'sparking', 'ignition', 'expectedAnnualLoss']) {
      expect(bands.bands[m].p05).toBeLessThanOrEqual(bands.bands[m].p50)
      expect(bands.bands[m].p50).toBeLessThanOrEqual(bands.bands[m].p95)
    }
    // the flash-density factor (σ of ln 0.3) alone makes the band wider than ±30 % (common practice: lognormal 5–95 % = e^{±1.645σ})
    expect(bands.bands.ignition.p95 / bands.bands.ignition.p05).toBeGreaterThan(1.6)
    // three factors: the flash-density factor, the correlated U50 + σ pair, ignition given a spark
    expect(bands.sensitivity.map((s: { metric: string }) => s.metric)).toEqual(['expectedFires', 'aal'])
    expect(bands.sensitivity[0].indices).toHaveLength(3)
    // same seed, other chunks: bit-identical portfolio bands and indices (sums in site-id order)
    const { rows } = await pool.query(`SELECT draws FROM run_portfolio_results WHERE run_id = ANY($1) ORDER BY run_id = $2`, [[one, two], one])
    expect(JSON.stringify(rows[0].draws)).toBe(JSON.stringify(rows[1].draws))
    // a site page shows the site's bands and indices, tanks their bands; the series stay in the database
    const { rows: [site] } = await pool.query(`SELECT site_id FROM run_site_results WHERE run_id = $1 ORDER BY ignition_rate DESC LIMIT 1`, [one])
    const detail = await (await viewer.get(`/api/runs/${one}/sites/${site.site_id}`)).json()
    expect(detail.assumptionBands.bands.ignition.p95).toBeGreaterThan(0)
    expect(detail.assumptionBands.series).toBeUndefined()
    expect(detail.tanks[0].assumptionBands.ignition.p50).toBeGreaterThan(0)
    // the portfolio's band: the sites' figures added draw by draw (rows 1…K of each stored series), then
    // the type-7 quantile (Hyndman & Fan 1996) at 5 and 95 %
    const { rows: sites } = await pool.query(`SELECT draws FROM run_site_results WHERE run_id = $1`, [one])
    const sum = new Float64Array(50)
    for (const s of sites) {
      const b = Buffer.from(s.draws.series.ignition, 'base64')
      const v = new Float32Array(b.buffer.slice(b.byteOffset, b.byteOffset + b.byteLength)) // stored as Float32
      for (let k = 0; k < 50; k++) sum[k]! += v[1 + k]!
    }
    const sorted = Array.from(sum).sort((x, y) => x - y)
    const q = (p: number) => { const h = 49 * p, lo = Math.floor(h); return sorted[lo]! + (h - lo) * (sorted[lo + 1]! - sorted[lo]!) }
    expect(bands.bands.ignition.p05 / q(0.05)).toBeCloseTo(1, 12)
    expect(bands.bands.ignition.p95 / q(0.95)).toBeCloseTo(1, 12)
    // the workbook: the band beside the interval in the summary, band columns for sites and tanks, the ranked indices
    const res = await underwriter.get(`/api/runs/${one}/export`)
    expect(res.status).toBe(200)
    const wb = new ExcelJS.Workbook()
    await wb.xlsx.load(Buffer.from(await res.arrayBuffer()) as unknown as ExcelJS.Buffer)
    expect(wb.worksheets.map(w => w.name)).toEqual(['Summary', 'Sites', 'Tanks', 'Exceedance', 'Sensitivity', 'Assumptions'])
    const summary = wb.getWorksheet('Summary')!.getColumn(1).values.map(String)
    expect(summary).toContain('Assumption band across 50 draws of the uncertain assumptions')
    const tankHeaders = (wb.getWorksheet('Tanks')!.getRow(1).values as unknown[]).map(String)
    expect(tankHeaders).toContain('Expected fires, assumption band 95 %, /yr')
    expect(wb.getWorksheet('Sensitivity')!.rowCount).toBe(1 + 2 * 3)
  }, 300_000)

  it('simulated years: bands of AAL, fires and return-period losses, central figures unchanged, the same whatever the chunks', async () => {
    const body = { mode: 'year', years: 3000, seed: 91 }
    const one = await start({ ...body, assumptionDraws: 50, chunkSize: 5 })
    const two = await start({ ...body, assumptionDraws: 50, chunkSize: 2 })
    const none = await start({ ...body, assumptionDraws: 0, chunkSize: 5 })
    for (const id of [one, two, none]) expect((await waitForRun(viewer, id, 240_000)).state).toBe('succeeded')
    const { rows } = await pool.query(`SELECT run_id, draws, year_summary, ignition_rate FROM run_portfolio_results WHERE run_id = ANY($1)`, [[one, two, none]])
    // eslint-disable-next-line @typescript-eslint/no-explicit-any
    const by: Record<string, any> = Object.fromEntries(rows.map((r: { run_id: string }) => [r.run_id, r]))
    // same inputs and seed, other chunks: bit-identical bands
    expect(JSON.stringify(by[one].draws)).toBe(JSON.stringify(by[two].draws))
    // the central figures are those of the same run without draws, bit for bit
    expect(JSON.stringify(by[one].year_summary)).toBe(JSON.stringify(by[none].year_summary))
    expect(by[one].ignition_rate).toBe(by[none].ignition_rate)
    const d = by[one].draws
    expect(d.draws).toBe(50)
    expect(d.years.years).toBe(2000) // DRAW_YEARS: the run's 3000 years capped
    const aal = d.years.averageAnnualLoss
    expect(aal.p05).toBeLessThanOrEqual(aal.p50)
    expect(aal.p50).toBeLessThanOrEqual(aal.p95)
    const rp100 = d.years.aggregate.find((p: { returnPeriodYears: number }) => p.returnPeriodYears === 100)
    expect(rp100.band === null || rp100.band.p05 <= rp100.band.p95).toBe(true)
    expect(d.years.aggregate.map((p: { returnPeriodYears: number }) => p.returnPeriodYears)).toEqual([10, 25, 50, 100, 250, 500, 1000]) // the run's return periods
    // the site view carries the bands and not the stored year tables
    const { rows: [site] } = await pool.query(`SELECT site_id FROM run_site_results WHERE run_id = $1 ORDER BY ignition_rate DESC LIMIT 1`, [one])
    const detail = await (await viewer.get(`/api/runs/${one}/sites/${site.site_id}`)).json()
    expect(detail.assumptionBands.years.averageAnnualLoss).not.toBeUndefined()
    expect(detail.assumptionBands.yearTables).toBeUndefined()
  }, 300_000)

  it('a run without draws says so; the option is refused where it cannot work', async () => {
    const plain = await analyst.post('/api/runs', { portfolioId, assumptionVersionId: plainVersionId, ...quick, seed: 3 })
    const id = (await plain.json()).id
    await waitForRun(viewer, id)
    expect((await (await viewer.get(`/api/runs/${id}/dashboard`)).json()).assumptionBands).toBeNull()
    const noUncertainty = await analyst.post('/api/runs', { portfolioId, assumptionVersionId: plainVersionId, ...quick, assumptionDraws: 50 })
    expect(noUncertainty.status).toBe(400)
    expect(await noUncertainty.text()).toMatch(/gives no assumption an uncertainty/)
    // simulated years with storm clustering refuse a drawn flash-density factor (the storm field is fixed at the central densities)
    const clustered = await analyst.post('/api/runs', { portfolioId, assumptionVersionId: versionId, mode: 'year', years: 1000, stormClustering: true, assumptionDraws: 50 })
    expect(clustered.status).toBe(400)
    expect(await clustered.text()).toMatch(/storm clustering/)
    const tooFew = await analyst.post('/api/runs', { portfolioId, assumptionVersionId: versionId, ...quick, assumptionDraws: 10 })
    expect(tooFew.status).toBe(400)
    expect(await tooFew.text()).toMatch(/0 \(off\) or 50–500/)
  }, 120_000)
})
