import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import ExcelJS from 'exceljs'
import { defaultAssumptions } from '../../shared/engine/assumptions'
import { createOrganisation, memberClient, type Client } from '../support/accounts'
import { testPool } from '../support/db'
import { waitForRun } from '../support/runs'
import { createDefaultAssumptions, createFleet } from '../support/fleet'

const pool = testPool()
let analyst: Client
let underwriter: Client
let viewer: Client
let runId: string
const HOSTILE_NAME = '=HYPERLINK("http://example.invalid","open me")'


beforeAll(async () => {
  const org = await createOrganisation(pool, 'Results Test Insurer', 'insurer')
  // Money in the organisation's currency, not USD: the workbook's headers must say EUR.
  await pool.query(`UPDATE organisations SET currency = 'EUR' WHERE id = $1`, [org])
  analyst = await memberClient(pool, org, 'analyst')
  underwriter = await memberClient(pool, org, 'underwriter')
  viewer = await memberClient(pool, org, 'viewer')
  const portfolioId = await createFleet(pool, org, { sites: 4, tanksPerSite: 2, seed: 'results-test' })
  // A site whose name and operator a spreadsheet would run as formulas (OWASP CSV injection examples).
  await pool.query(`UPDATE sites SET name = $1, operator_name = '+cmd|calc' WHERE id = (SELECT site_id FROM portfolio_sites WHERE portfolio_id = $2 ORDER BY site_id LIMIT 1)`, [HOSTILE_NAME, portfolioId])
  const versionId = await createDefaultAssumptions(pool, org, defaultAssumptions)
  const res = await analyst.post('/api/runs', { portfolioId, assumptionVersionId: versionId, mode: 'year', years: 3000, seed: 31, chunkSize: 2 })
  runId = (await res.json()).id
  expect((await waitForRun(analyst, runId)).state).toBe('succeeded')
}, 300_000)
afterAll(() => pool.end())

describe('results of a run', () => {
  it('dashboard: headline figures are the stored portfolio results and drivers come with shares of the total', async () => {
    const res = await viewer.get(`/api/runs/${runId}/dashboard`)
    expect(res.status).toBe(200)
    const d = await res.json()
    const { rows: [p] } = await pool.query(`SELECT ignition_rate, expected_annual_loss, year_summary FROM run_portfolio_results WHERE run_id = $1`, [runId])
    expect(d.headline.ignitionPerYear.value).toBe(p.ignition_rate)
    expect(d.headline.averageAnnualLoss.value).toBe(Number(p.expected_annual_loss))
    // The 100-year aggregate loss is the stored table's entry for T = 100 (common practice: same table read twice).
    expect(d.headline.lossAt100Years.value).toBe(p.year_summary.aggregate.find((r: { returnPeriodYears: number }) => r.returnPeriodYears === 100).loss)
    // Total (aggregate and occurrence), then the aggregate curves of property damage and business interruption.
    expect(d.exceedance.map((s: { kind: string }) => s.kind)).toEqual(['aggregate', 'occurrence', 'aggregate', 'aggregate'])
    expect(d.exceedance.map((s: { name: string }) => s.name).slice(2)).toEqual([`${d.run.portfolioName}, property damage`, `${d.run.portfolioName}, business interruption`])
    // PD + BI = total AAL, stored and shown (hand-worked identity, up to cents rounding of the stored money columns).
    const { rows: [split] } = await pool.query(`SELECT expected_annual_loss_pd, expected_annual_loss_bi FROM run_portfolio_results WHERE run_id = $1`, [runId])
    expect(d.headline.averageAnnualLossSplit).toEqual({ propertyDamage: Number(split.expected_annual_loss_pd), businessInterruption: Number(split.expected_annual_loss_bi) })
    expect(Math.abs(d.headline.averageAnnualLossSplit.propertyDamage + d.headline.averageAnnualLossSplit.businessInterruption - d.headline.averageAnnualLoss.value)).toBeLessThanOrEqual(0.02)
    // Site drivers: their values add up to the total over all 4 sites (frequency of fires adds; common practice).
    const sum = d.drivers.sites.reduce((n: number, s: { value: number }) => n + s.value, 0)
    expect(sum).toBeCloseTo(d.drivers.total, 10)
  })

  it('site list and site detail carry the frozen facts and the tanks', async () => {
    const sites = await (await viewer.get(`/api/runs/${runId}/sites`)).json()
    expect(sites.sites).toHaveLength(4)
    const hostile = sites.sites.find((s: { name: string }) => s.name === HOSTILE_NAME)
    expect(hostile).toBeTruthy()
    const detail = await (await viewer.get(`/api/runs/${runId}/sites/${hostile.siteId}`)).json()
    expect(detail.tanks).toHaveLength(2)
    expect(detail.eventBands.currentBandsKa.length).toBeGreaterThan(2)
    // Each tank's PD + BI is its expected annual loss (to the cent of the stored money columns).
    for (const t of detail.tanks) expect(Math.abs(t.lossSplit.propertyDamage + t.lossSplit.businessInterruption - t.expectedAnnualLoss.rate)).toBeLessThanOrEqual(0.02)
    // Fire spread is part of the run's assumptions (the defaults): the neighbour lists come with it, most likely first.
    expect(detail.spread.modelled).toBe(true)
    for (const list of Object.values(detail.spread.byTank) as { probability: number }[][]) {
      for (let k = 1; k < list.length; k++) expect(list[k]!.probability).toBeLessThanOrEqual(list[k - 1]!.probability)
    }
  })

  it('workbook: sheets and headers as specified, totals equal the stored results, hostile text stays text', async () => {
    expect((await viewer.get(`/api/runs/${runId}/export`)).status).toBe(403)
    const res = await underwriter.get(`/api/runs/${runId}/export`)
    expect(res.status).toBe(200)
    const wb = new ExcelJS.Workbook()
    await wb.xlsx.load(Buffer.from(await res.arrayBuffer()) as unknown as ExcelJS.Buffer)
    expect(wb.worksheets.map(w => w.name)).toEqual(['Summary', 'Sites', 'Tanks', 'Exceedance', 'Assumptions'])
    const summary = wb.getWorksheet('Summary')!
    expect(String(summary.getCell(2, 2).value)).toMatch(/not a lightning-protection design/)
    const { rows: [p] } = await pool.query(`SELECT ignition_rate FROM run_portfolio_results WHERE run_id = $1`, [runId])
    expect(summary.getCell(6, 2).value).toBe(p.ignition_rate)
    const provenance = summary.getColumn(1).values.map(String)
    for (const label of ['Run id', 'Seed', 'Engine version', 'Assumption set', 'Input hash (sha-256)', 'Exported by']) expect(provenance).toContain(label)
    const sites = wb.getWorksheet('Sites')!
    const headers = (sites.getRow(1).values as unknown[]).map(String)
    expect(headers).toContain('Expected fires, /yr')
    // Units in every header except the names (issue #18): money in the organisation's currency.
    expect(headers).toContain('Average annual loss (AAL), EUR/yr')
    for (const h of headers.slice(4)) expect(h).toMatch(/, (\/yr|EUR\/yr|EUR|m|count|° \(WGS 84\))$/)
    // Readable formats: frequencies with fixed decimals (never 0.000E+00), money in whole units.
    const fires = sites.getCell(2, headers.indexOf('Expected fires, /yr')).numFmt
    expect(fires).toMatch(/^0\.0{2,8}$/)
    expect(sites.getCell(2, headers.indexOf('Average annual loss (AAL), EUR/yr')).numFmt).toBe('#,##0')
    expect(summary.getCell(6, 2).numFmt).toMatch(/^0\.0{2,8}$/)
    expect(summary.getCell(9, 1).value).toBe('Average annual loss (AAL), EUR/yr')
    const tanks = wb.getWorksheet('Tanks')!
    for (let c = 1; c <= tanks.columnCount; c++) expect(String(tanks.getCell(2, c).numFmt ?? '')).not.toMatch(/E\+/)
    const names = sites.getColumn(1).values.slice(2) as unknown[]
    // Every cell is a plain string: no formula object, and the hostile one starts with an apostrophe (OWASP guidance).
    for (const v of names) expect(typeof v).toBe('string')
    expect(names).toContain(`'${HOSTILE_NAME}`)
    expect(sites.getColumn(3).values).toContain(`'+cmd|calc`)
    expect(wb.getWorksheet('Tanks')!.rowCount).toBe(1 + 8)
    const { rows: audit } = await pool.query(`SELECT action FROM audit_events WHERE entity = 'run' AND entity_id = $1 AND action = 'export'`, [runId])
    expect(audit).toHaveLength(1)
  })

  it('referral notes: underwriters write, viewers read and may not write', async () => {
    const sites = await (await viewer.get(`/api/runs/${runId}/sites`)).json()
    const siteId = sites.sites[0].siteId
    expect((await viewer.post(`/api/sites/${siteId}/notes`, { body: 'not allowed' })).status).toBe(403)
    expect((await underwriter.post(`/api/sites/${siteId}/notes`, { body: '' })).status).toBe(400)
    expect((await underwriter.post(`/api/sites/${siteId}/notes`, { body: 'Refer: no shields on the condensate tanks.' })).status).toBe(201)
    const notes = await (await viewer.get(`/api/sites/${siteId}/notes`)).json()
    expect(notes[0].body).toBe('Refer: no shields on the condensate tanks.')
    expect(notes[0].author).toMatch(/underwriter/)
  })
})
