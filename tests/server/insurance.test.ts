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
    expect(read.sites.find((s: { id: string }) => s.id === siteA).terms).toEqual({ occurrenceDeductible: 80, occurrenceLimit: 400, aggregateDeductible: 100, aggregateLimit: 500, interruptionDeductible: 0, share: 0.5 }) // a row saved without a waiting period has none
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
    expect(wb.worksheets.map(w => w.name)).toEqual(['Summary', 'Sites', 'Premium', 'Exceedance', 'Layers', 'Largest events'])
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
    // The last three rows: the total, then its PD and BI parts.
    const total = premium.getRow(premium.rowCount - 2)
    expect(total.getCell(2).value).toBe('Total')
    expect(total.getCell(3).value).toBe('total')
    expect(Number(total.getCell(9).value)).toBeCloseTo((102 + 0.1 * 435) / 0.7, 6)
    // Every hand-made loss is property damage (no BI part given): PD carries the whole premium.
    expect(Number(premium.getRow(premium.rowCount - 1).getCell(9).value)).toBeCloseTo((102 + 0.1 * 435) / 0.7, 6)
    expect(Number(premium.getRow(premium.rowCount).getCell(9).value)).toBe(0)
  })
})

describe('property damage, interruption and layers on a hand-made run', () => {
  // Ten simulated years. Site A events (year, loss, of which PD): (0, 1000, 600), (3, 500, 100).
  // Site B: (3, 800, 800). Terms on A: no occurrence deductible, BI waiting period 300, share 100 %.
  let runId: string
  let versionId: string
  const q = 'returnPeriodYears=5&method=std_dev&factor=0&expenseRatio=0.2&profitRatio=0'

  beforeAll(async () => {
    runId = await insertHandMadeRun(pool, { organisationId: org, portfolioId, assumptionVersionId, years: 10, siteEvents: { [siteA]: [[0, 1000, 600], [3, 500, 100]], [siteB]: [[3, 800, 800]] } })
    const { rows } = await pool.query(`SELECT v.id FROM policy_terms_versions v JOIN policy_terms_sets s ON s.id = v.terms_set_id WHERE s.organisation_id = $1 ORDER BY v.version DESC LIMIT 1`, [org])
    const put = await underwriter.request('PUT', `/api/policy-terms-versions/${rows[0].id}`, {
      note: 'Layers', sites: [{ siteId: siteA, occurrenceDeductible: 0, occurrenceLimit: null, aggregateDeductible: 0, aggregateLimit: null, interruptionDeductible: 300, share: 1 }],
      layers: [
        { name: 'Per-occurrence 500 xs 600', kind: 'occurrence', attachment: 600, limit: 500 },
        { name: 'Aggregate 1000 xs 1000', kind: 'aggregate', attachment: 1000, limit: 1000 },
      ],
    })
    expect(put.status, await put.clone().text()).toBe(200)
    versionId = (await put.json()).version.id
  })

  it('keeps the layers with the version and refuses a bad one', async () => {
    const v = await (await viewer.get(`/api/policy-terms-versions/${versionId}`)).json()
    expect(v.layers.map((l: { name: string }) => l.name)).toEqual(['Per-occurrence 500 xs 600', 'Aggregate 1000 xs 1000'])
    const bad = await underwriter.request('PUT', `/api/policy-terms-versions/${versionId}`, { note: '', sites: [], layers: [{ name: 'x', kind: 'occurrence', attachment: -1, limit: 0 }] })
    expect(bad.status).toBe(400)
    expect((await analyst.request('PUT', `/api/policy-terms-versions/${versionId}`, { note: '', sites: [], layers: [] })).status).toBe(403)
  })

  it('splits PD and BI, applies the waiting period and prices the layers from the stored events', async () => {
    const res = await viewer.get(`/api/runs/${runId}/financial?${q}&termsVersionId=${versionId}`)
    expect(res.status, await res.clone().text()).toBe(200)
    const v = await res.json()
    expect(v.hasSplit).toBe(true)
    // Ground-up PD (600 + 100 + 800) / 10 = 150, BI (400 + 400) / 10 = 80, total 230.
    expect(v.portfolio.propertyDamage.groundUp.averageAnnualLoss).toBe(150)
    expect(v.portfolio.businessInterruption.groundUp.averageAnnualLoss).toBe(80)
    expect(v.portfolio.groundUp.averageAnnualLoss).toBe(230)
    // Insured: A (600 + 100) + (100 + 100) after the 300 waiting period; B 800 in full (no terms). BI insured (100 + 100) / 10 = 20.
    expect(v.portfolio.businessInterruption.insured.averageAnnualLoss).toBeCloseTo(20, 9)
    expect(v.portfolio.insured.averageAnnualLoss).toBeCloseTo(170, 9) // (700 + 200 + 800) / 10
    // Insured events: 700 (year 0), 200 and 800 (year 3).
    // Occurrence 500 xs 600: 100 + 200 = 300 over 10 years = 30; attaches in 2 years of 10; never exhausted (needs 1100).
    const [occ, agg] = v.layers
    expect(occ.expectedLoss).toBeCloseTo(30, 9)
    expect(occ.attachmentProbability).toBe(0.2)
    expect(occ.exhaustionProbability).toBe(0)
    // Aggregate 1000 xs 1000: year totals 700 and 1000 → nothing (1000 does not exceed 1000).
    expect(agg.expectedLoss).toBe(0)
    expect(agg.attachmentProbability).toBe(0)
    // Premium with no risk load and 20 % expenses: 30 / 0.8 = 37.5.
    expect(occ.premium.premium).toBeCloseTo(37.5, 9)
    for (const l of v.layers) expect(Math.max(0, ...l.summary.occurrenceCurve.map((p: { loss: number }) => p.loss))).toBeLessThanOrEqual(l.layer.limit)
    // Largest event: A's 1000 (PD 600).
    expect(v.largestEvents[0]).toMatchObject({ groundUp: 1000, groundUpPd: 600, insured: 700 })
  })

  it('the workbook carries the same figures as the screen', async () => {
    const view = await (await viewer.get(`/api/runs/${runId}/financial?${q}&termsVersionId=${versionId}`)).json()
    const res = await underwriter.get(`/api/runs/${runId}/financial-workbook?${q}&termsVersionId=${versionId}`)
    const wb = new ExcelJS.Workbook()
    await wb.xlsx.load(await res.arrayBuffer())
    const labels = new Map<string, unknown>()
    wb.getWorksheet('Summary')!.eachRow(r => labels.set(String(r.getCell(1).value), r.getCell(2).value))
    const currency = view.currency
    expect(labels.get(`Average annual loss (AAL), ground-up, PD, ${currency}/yr`)).toBe(view.portfolio.propertyDamage.groundUp.averageAnnualLoss)
    expect(labels.get(`Average annual loss (AAL), insurer's share, BI, ${currency}/yr`)).toBe(view.portfolio.businessInterruption.insured.averageAnnualLoss)
    // Units in every header, money in the organisation's currency, shares on [0, 1] as per cent (issue #18).
    const sites = wb.getWorksheet('Sites')!
    const headers = (sites.getRow(1).values as unknown[]).map(String)
    expect(headers).toContain(`AAL, insured, ${currency}/yr`)
    expect(sites.getCell(2, headers.indexOf(`AAL, insured, ${currency}/yr`)).numFmt).toBe('#,##0')
    expect(sites.getCell(2, headers.indexOf('Share of years deductible reached, %')).numFmt).toBe('0.0%')
    expect(sites.getCell(2, headers.indexOf('Insurer\'s share, %')).numFmt).toBe('0.0%')
    for (const h of headers.slice(5)) expect(h).toMatch(new RegExp(`, (${currency}(/yr)?|%)$`))
    const exceedance = wb.getWorksheet('Exceedance')!
    expect(exceedance.getCell(1, 1).value).toBe('Return period, years')
    expect(exceedance.getCell(2, 2).numFmt).toBe('0.0%')
    const layers = wb.getWorksheet('Layers')!
    expect(layers.getRow(2).getCell(1).value).toBe('Per-occurrence 500 xs 600')
    expect(layers.getRow(2).getCell(5).value).toBe(view.layers[0].expectedLoss)
    expect(layers.getRow(2).getCell(14).value).toBe(view.layers[0].premium.premium)
    const largest = wb.getWorksheet('Largest events')!
    expect(largest.getRow(2).getCell(3).value).toBe(view.largestEvents[0].groundUp)
    expect(largest.getRow(2).getCell(4).value).toBe(view.largestEvents[0].groundUpPd)
  })

  it('reads a run stored before the split as total only', async () => {
    const old = await insertHandMadeRun(pool, { organisationId: org, portfolioId, assumptionVersionId, years: 10, engine1: true, siteEvents: { [siteA]: [[0, 1000]], [siteB]: [[3, 800]] } })
    const v = await (await viewer.get(`/api/runs/${old}/financial?${q}&termsVersionId=${versionId}`)).json()
    expect(v.hasSplit).toBe(false)
    expect(v.portfolio.groundUp.averageAnnualLoss).toBe(180) // (1000 + 800) / 10
    // All of it counted as property damage: the BI waiting period does not apply; A 1000, B 800 in full.
    expect(v.portfolio.insured.averageAnnualLoss).toBe(180)
  })
})
