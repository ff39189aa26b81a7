import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import ExcelJS from 'exceljs'
import { defaultAssumptions } from '../../shared/engine/assumptions'
import { CAUTION_TEXT } from '../../shared/caution'
import { createOrganisation, memberClient, type Client } from '../support/accounts'
import { testPool } from '../support/db'
import { createDefaultAssumptions, createFleet } from '../support/fleet'

const pool = testPool()
let org: string
let manager: Client
let analyst: Client
let viewer: Client
let versionId: string

async function waitForEvaluation(client: Client, id: string, timeoutMs = 180_000) {
  const started = Date.now()
  for (;;) {
    const evaluation = await (await client.get(`/api/capital/evaluations/${id}`)).json()
    if (!['queued', 'running'].includes(evaluation.state)) return evaluation
    if (Date.now() - started > timeoutMs) throw new Error(`evaluation ${id} still ${evaluation.state}`)
    await new Promise(r => setTimeout(r, 300))
  }
}

beforeAll(async () => {
  org = await createOrganisation(pool, 'Capital Test Operator')
  manager = await memberClient(pool, org, 'asset_manager')
  analyst = await memberClient(pool, org, 'analyst')
  viewer = await memberClient(pool, org, 'viewer')
  await createFleet(pool, org, { sites: 4, tanksPerSite: 3, seed: 'capital-test' })
  versionId = await createDefaultAssumptions(pool, org, defaultAssumptions)
})
afterAll(() => pool.end())

describe('capital planning', () => {
  let shieldId: string

  it('gives each organisation an editable catalogue in its currency, grounding recorded with no effect', async () => {
    const res = await manager.get('/api/capital/options')
    expect(res.status).toBe(200)
    const body = await res.json()
    const grounding = body.options.find((o: { kind: string }) => o.kind === 'grounding')
    expect(grounding.noEffectReason).toMatch(/do not reduce induced sparking/)
    shieldId = body.options.find((o: { kind: string }) => o.kind === 'shield').id
    const edit = await manager.patch(`/api/capital/options/${shieldId}`, { fixedCost: 5000, rate: 1000, costBasis: 'diameter_m', costStep: 100 })
    expect(edit.status, await edit.clone().text()).toBe(200)
    expect((await analyst.patch(`/api/capital/options/${shieldId}`, { fixedCost: 1 })).status).toBe(403)
  })

  it('adds actions in bulk by filter, each priced by the cost rule', async () => {
    const res = await manager.post('/api/capital/actions', { optionId: shieldId, filter: { material: 'frp', contents: 'crude', minHeightM: 5 } })
    expect(res.status, await res.clone().text()).toBe(201)
    const { added } = await res.json()
    // Brute force in the test: the tanks that match, counted straight from the inventory.
    const { rows } = await pool.query(`SELECT t.diameter_m FROM tanks t JOIN sites s ON s.id = t.site_id WHERE s.organisation_id = $1 AND t.material = 'frp' AND t.contents = 'crude' AND t.height_m > 5`, [org])
    expect(added).toBe(rows.length)
    expect(added).toBeGreaterThan(0)
    const list = await (await viewer.get('/api/capital/actions')).json()
    // Cost worked by hand from the rule: 5,000 + 1,000 × diameter, rounded up to 100.
    const expected = rows.map((r: { diameter_m: number }) => Math.ceil((5000 + 1000 * r.diameter_m) / 100 - 1e-9) * 100).sort((a: number, b: number) => a - b)
    expect(list.actions.map((a: { cost: number }) => a.cost).sort((a: number, b: number) => a - b)).toEqual(expected)
    // Adding the same again adds nothing (one action per option and tank).
    expect((await (await manager.post('/api/capital/actions', { optionId: shieldId, filter: { material: 'frp', contents: 'crude', minHeightM: 5 } })).json()).added).toBe(0)
    expect((await analyst.post('/api/capital/actions', { optionId: shieldId, filter: {} })).status).toBe(403)
  })

  it('lets analysts, not asset managers, evaluate; reductions come with a paired error below the independent one', async () => {
    // A second kind of action on every tank, so some sites hold several actions.
    const options = (await (await manager.get('/api/capital/options')).json()).options
    const vapour = options.find((o: { kind: string }) => o.kind === 'vapour_control').id
    expect((await manager.post('/api/capital/actions', { optionId: vapour, filter: {} })).status).toBe(201)
    expect((await manager.post('/api/capital/evaluations', { assumptionVersionId: versionId })).status).toBe(403)
    const res = await analyst.post('/api/capital/evaluations', { assumptionVersionId: versionId, samplesPerTank: 4000, seed: 17 })
    expect(res.status, await res.clone().text()).toBe(201)
    const evaluation = await waitForEvaluation(analyst, (await res.json()).id)
    expect(evaluation.state, evaluation.error).toBe('succeeded')
    const shields = evaluation.scenarios.filter((s: { figures: { site: { sparking: { reduction: { rate: number } } } } }) => s.figures.site.sparking.reduction.rate > 0)
    expect(shields.length).toBeGreaterThan(0)
    for (const s of shields) expect(s.figures.site.ignition.reduction.se).toBeLessThan(s.figures.site.ignition.independentSe)
  })

  it('turns a budget into the best plan, saves it, measures it site by site and exports it with the caution', async () => {
    const res = await viewer.get('/api/capital/best-plan?budget=40000&metric=loss')
    expect(res.status).toBe(200)
    const best = await res.json()
    expect(best.plan.totalCost).toBeLessThanOrEqual(40000)
    expect(best.plan.chosen.length).toBeGreaterThan(0)
    // The frontier never falls as the budget grows (a larger budget allows every smaller plan).
    for (let i = 1; i < best.frontier.length; i++) expect(best.frontier[i].value).toBeGreaterThanOrEqual(best.frontier[i - 1].value)
    expect((await analyst.post('/api/capital/plans', { name: 'Refused', budget: 40000 })).status).toBe(403)
    const saved = await manager.post('/api/capital/plans', { name: 'Forty thousand', budget: 40000, metric: 'loss' })
    expect(saved.status, await saved.clone().text()).toBe(201)
    const plan = await saved.json()
    expect(plan.actionIds).toEqual(best.plan.chosen)

    const check = await analyst.post('/api/capital/evaluations', { assumptionVersionId: versionId, samplesPerTank: 4000, seed: 17, planId: plan.id })
    expect(check.status).toBe(201)
    expect((await waitForEvaluation(analyst, (await check.json()).id)).state).toBe('succeeded')
    const detail = await (await viewer.get(`/api/capital/plans/${plan.id}`)).json()
    expect(detail.sites.every((s: { together: unknown }) => s.together !== null)).toBe(true)

    expect((await viewer.get(`/api/capital/plans/${plan.id}/export`)).status).toBe(403)
    const exported = await manager.get(`/api/capital/plans/${plan.id}/export`)
    expect(exported.status).toBe(200)
    const wb = new ExcelJS.Workbook()
    await wb.xlsx.load(Buffer.from(await exported.arrayBuffer()) as unknown as ExcelJS.Buffer)
    expect(String(wb.getWorksheet('Plan')!.getCell(1, 2).value)).toContain(CAUTION_TEXT.short)
    expect(wb.getWorksheet('Actions')!.rowCount).toBe(1 + plan.actionIds.length)
    // Units in the headers (issue #18): money in the organisation's currency, reductions per year.
    const actions = wb.getWorksheet('Actions')!
    const headers = (actions.getRow(1).values as unknown[]).map(String)
    expect(headers).toEqual(expect.arrayContaining(['Cost, USD', 'Expected fires reduction, /yr', 'AAL reduction, USD/yr']))
    expect(actions.getCell(2, headers.indexOf('Cost, USD')).numFmt).toBe('#,##0')
    expect(actions.getCell(2, headers.indexOf('Expected fires reduction, /yr')).numFmt).toMatch(/^0\.0{2,8}$/)
  })
})
