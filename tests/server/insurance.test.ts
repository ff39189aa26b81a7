// Policy terms and the financial view through the API: role rules, versions frozen by runs, and the
// insured figures of a small hand-made run worked out by hand in the comments.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import ExcelJS from 'exceljs'
import { defaultAssumptions } from '../../shared/engine/assumptions'
import { createOrganisation, memberClient, type Client } from '../support/accounts'
import { testPool } from '../support/db'
import { createDefaultAssumptions, createFleet } from '../support/fleet'
import { insertHandMadeRun } from '../support/insurance'

const pool = testPool()
let org: string
let underwriter: Client
let analyst: Client
let viewer: Client
let admin: Client
let portfolioId: string
let assumptionVersionId: string
let siteA: string
let siteB: string

/** A succeeded 10-year run with the given site events. */
const handMadeRun = (siteEvents: Record<string, [number, number][]>, names: Record<string, string> = {}) =>
  insertHandMadeRun(pool, { organisationId: org, portfolioId, assumptionVersionId, years: 10, siteEvents, names })

beforeAll(async () => {
  org = await createOrganisation(pool, 'Terms Test Insurer', 'insurer')
  ;[underwriter, analyst, viewer, admin] = await Promise.all([memberClient(pool, org, 'underwriter'), memberClient(pool, org, 'analyst'), memberClient(pool, org, 'viewer'), memberClient(pool, org, 'admin')])
  portfolioId = await createFleet(pool, org, { sites: 2, tanksPerSite: 1, seed: 'terms-test', name: 'Terms fleet' })
  assumptionVersionId = await createDefaultAssumptions(pool, org, defaultAssumptions)
  const { rows } = await pool.query(`SELECT site_id FROM portfolio_sites WHERE portfolio_id = $1 ORDER BY site_id`, [portfolioId])
  ;[siteA, siteB] = rows.map(r => r.site_id)
})
afterAll(() => pool.end())

const termsA = () => ({ siteId: siteA, occurrenceDeductible: 80, occurrenceLimit: 400, aggregateDeductible: 100, aggregateLimit: 500, share: 0.5 })

describe('terms editing and roles', () => {
  let setId: string
  let versionId: string

  it('underwriters and admins put terms on a portfolio; analysts and viewers read them only', async () => {
    expect((await analyst.post('/api/policy-terms', { portfolioId, name: 'Book terms' })).status).toBe(403)
    expect((await viewer.post('/api/policy-terms', { portfolioId, name: 'Book terms' })).status).toBe(403)
    const res = await underwriter.post('/api/policy-terms', { portfolioId, name: 'Book terms' })
    expect(res.status).toBe(200)
    const body = await res.json()
    setId = body.set.id
    versionId = body.version.id
    expect(body.version.version).toBe(1)
    expect((await admin.post('/api/policy-terms', { portfolioId, name: 'Second' })).status).toBe(409) // one set per portfolio
    const list = await (await viewer.get('/api/policy-terms')).json()
    expect(list.map((s: { name: string, latestVersion: number }) => [s.name, s.latestVersion])).toEqual([['Book terms', 1]])
  })

  it('saves site rows in place while no run has used the version, and checks them', async () => {
    expect((await analyst.request('PUT', `/api/policy-terms-versions/${versionId}`, { note: '', sites: [termsA()] })).status).toBe(403)
    const bad = await underwriter.request('PUT', `/api/policy-terms-versions/${versionId}`, { note: '', sites: [{ ...termsA(), share: 1.5 }] })
    expect(bad.status).toBe(400)
    const stranger = await underwriter.request('PUT', `/api/policy-terms-versions/${versionId}`, { note: '', sites: [{ ...termsA(), siteId: crypto.randomUUID() }] })
    expect(stranger.status).toBe(400)
    const ok = await underwriter.request('PUT', `/api/policy-terms-versions/${versionId}`, { note: 'Book terms', sites: [termsA()] })
    expect(ok.status).toBe(200)
    expect((await ok.json()).createdNewVersion).toBe(false)
    const read = await (await viewer.get(`/api/policy-terms-versions/${versionId}`)).json()
    expect(read.sites.find((s: { id: string }) => s.id === siteA).terms).toEqual({ occurrenceDeductible: 80, occurrenceLimit: 400, aggregateDeductible: 100, aggregateLimit: 500, share: 0.5 })
    expect(read.sites.find((s: { id: string }) => s.id === siteB).terms).toBeNull()
  })

  it('a run records the portfolio\'s newest terms version; saving it afterwards makes version 2', async () => {
    const res = await analyst.post('/api/runs', { portfolioId, assumptionVersionId, mode: 'year', years: 100 })
    expect(res.status, await res.clone().text()).toBe(201)
    const runId = (await res.json()).id
    const { rows } = await pool.query(`SELECT terms_version_id FROM run_terms WHERE run_id = $1`, [runId])
    expect(rows[0]?.terms_version_id).toBe(versionId)
    await analyst.post(`/api/runs/${runId}/cancel`)
    const edited = await underwriter.request('PUT', `/api/policy-terms-versions/${versionId}`, { note: 'Higher deductible', sites: [{ ...termsA(), occurrenceDeductible: 200 }] })
    const body = await edited.json()
    expect(body.createdNewVersion).toBe(true)
    expect(body.version.version).toBe(2)
    const first = await (await viewer.get(`/api/policy-terms-versions/${versionId}`)).json()
    expect(first.sites.find((s: { id: string }) => s.id === siteA).terms.occurrenceDeductible).toBe(80) // frozen
    const set = await (await viewer.get(`/api/policy-terms/${setId}`)).json()
    expect(set.versions.map((v: { version: number }) => v.version)).toEqual([2, 1])
  })

  it('answers 404 for another organisation\'s terms', async () => {
    const other = await createOrganisation(pool, 'Other Insurer', 'insurer')
    const stranger = await memberClient(pool, other, 'admin')
    expect((await stranger.get(`/api/policy-terms/${setId}`)).status).toBe(404)
    expect((await stranger.request('PUT', `/api/policy-terms-versions/${versionId}`, { note: '', sites: [] })).status).toBe(404)
  })
})

describe('financial view of a hand-made run', () => {
  // Ten simulated years. Site A: year 0 events 100 then 300, year 1: 50, year 2: 1000.
  // Site B: year 0: 200, year 5: 600 (no terms: counts in full).
  let runId: string
  let versionId: string
  const q = 'returnPeriodYears=5&method=tvar&factor=0.1&expenseRatio=0.2&profitRatio=0.1'

  beforeAll(async () => {
    runId = await handMadeRun({ [siteA]: [[0, 100], [0, 300], [1, 50], [2, 1000]], [siteB]: [[0, 200], [5, 600]] }, { [siteA]: '=HYPERLINK("x")' })
    const { rows } = await pool.query(`SELECT v.id FROM policy_terms_versions v JOIN policy_terms_sets s ON s.id = v.terms_set_id WHERE s.organisation_id = $1 AND v.version = 1`, [org])
    versionId = rows[0].id
    await pool.query(`INSERT INTO run_terms (run_id, terms_version_id) VALUES ($1, $2)`, [runId, versionId])
  })

  it('applies the run\'s terms: ground-up, after terms and insured per site and for the portfolio', async () => {
    const res = await viewer.get(`/api/runs/${runId}/financial?${q}`)
    expect(res.status, await res.clone().text()).toBe(200)
    const v = await res.json()
    expect(v.terms.versionId).toBe(versionId)
    const a = v.sites.find((s: { siteId: string }) => s.siteId === siteA)
    const b = v.sites.find((s: { siteId: string }) => s.siteId === siteB)
    // A: occurrence-net 20, 220, 0, 400; year 0: 240 − 100 = 140; year 2: 400 − 100 = 300 → 440 after terms, 220 insured over 10 years.
    expect(a.averageAnnualLoss).toEqual({ groundUp: 145, afterTerms: 44, insured: 22 })
    expect(a.deductibleReachedShare).toBe(0.2) // years 0 and 2 of 10
    expect(b.hasTerms).toBe(false)
    expect(b.averageAnnualLoss.insured).toBe(80) // (200 + 600) / 10
    expect(v.sitesWithoutTerms).toBe(1)
    expect(v.portfolio.groundUp.averageAnnualLoss).toBe(225) // (1450 + 800) / 10
    expect(v.portfolio.insured.averageAnnualLoss).toBeCloseTo(102, 9) // 22 + 80
    // Portfolio insured years: 270 (70 + 200), 150, 600 → at 5 years k = 2 → 270, from A 70 and B 200.
    expect(v.portfolio.insuredLossAtTail).toBe(270)
    expect(a.tail.lossContribution).toBe(70)
    expect(b.tail.lossContribution).toBe(200)
    // TVaR at 5 years: (600 + 270) / 2 = 435; premium lines add up to the premium.
    expect(v.portfolio.insuredTailValueAtRisk).toBe(435)
    const p = v.portfolio.premium
    expect(p.expectedLoss + p.riskLoad + p.expenses + p.profit).toBeCloseTo(p.premium, 6)
    expect(p.premium).toBeCloseTo((102 + 0.1 * 435) / 0.7, 6) // (expected + 0.1 × TVaR) / (1 − 0.2 − 0.1)
  })

  it('evaluates a changed deductible on the stored events at once', async () => {
    const one = await (await viewer.get(`/api/runs/${runId}/financial?${q}&whatIfSiteId=${siteA}&whatIfOccurrenceDeductible=500`)).json()
    // A with a 500 deductible: only 1000 → min(500, 400) = 400; year 2: 400 − 100 = 300, share 0.5 → 150 over 10 years.
    expect(one.whatIf.sites.find((s: { siteId: string }) => s.siteId === siteA).averageAnnualLoss.insured).toBe(15)
    expect(one.whatIf.portfolio.insured.averageAnnualLoss).toBeCloseTo(95, 9) // 15 + 80, B unchanged
    expect(one.portfolio.insured.averageAnnualLoss).toBeCloseTo(102, 9) // the baseline stays beside it
    const all = await (await viewer.get(`/api/runs/${runId}/financial?${q}&whatIfOccurrenceDeductible=500`)).json()
    // B too: 200 → 0, 600 → 100 → 10 a year.
    expect(all.whatIf.portfolio.insured.averageAnnualLoss).toBeCloseTo(25, 9)
  })

  it('refuses a frequency run and a return period longer than the run', async () => {
    expect((await viewer.get(`/api/runs/${runId}/financial?returnPeriodYears=250`)).status).toBe(400)
    await pool.query(`UPDATE runs SET mode = 'frequency' WHERE id = $1`, [runId])
    expect((await viewer.get(`/api/runs/${runId}/financial?${q}`)).status).toBe(400)
    await pool.query(`UPDATE runs SET mode = 'year' WHERE id = $1`, [runId])
  })

  it('exports a workbook with provenance and cautions, safe against formula injection; viewers do not export', async () => {
    expect((await viewer.get(`/api/runs/${runId}/financial-workbook?${q}`)).status).toBe(403)
    const res = await underwriter.get(`/api/runs/${runId}/financial-workbook?${q}`)
    expect(res.status).toBe(200)
    const wb = new ExcelJS.Workbook()
    await wb.xlsx.load(await res.arrayBuffer())
    expect(wb.worksheets.map(w => w.name)).toEqual(['Summary', 'Sites', 'Premium', 'Exceedance'])
    const summary = wb.getWorksheet('Summary')!
    const labels = new Map<string, unknown>()
    summary.eachRow(r => labels.set(String(r.getCell(1).value), r.getCell(2).value))
    expect(labels.get('Run id')).toBe(runId)
    expect(labels.get('Seed')).toBe(7)
    expect(String(labels.get('Terms version'))).toContain(versionId)
    expect(String(labels.get('Caution'))).toMatch(/not a lightning-protection design/)
    const sites = wb.getWorksheet('Sites')!
    const names: unknown[] = []
    sites.eachRow((r, i) => { if (i > 1) names.push(r.getCell(2).value) })
    expect(names).toContain('\'=HYPERLINK("x")') // OWASP: a leading apostrophe stops the formula
    const premium = wb.getWorksheet('Premium')!
    const total = premium.getRow(premium.rowCount)
    expect(total.getCell(2).value).toBe('Total')
    expect(Number(total.getCell(8).value)).toBeCloseTo((102 + 0.1 * 435) / 0.7, 6)
  })
})
