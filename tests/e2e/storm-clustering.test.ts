// In a real browser: an analyst starts a simulated-years run with storm clustering from the run
// form, and the dashboard and the financial view show the portfolio's aggregate exceedance curve
// with clustering and with the sites independent, side by side, with the tail figures of both.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchBrowser, openGuardedPage, saveScreenshot, type GuardedPage } from '../support/browser'
import { signInPage } from '../support/browser-session'
import { DEMO_PASSWORD, demoRun } from '../support/demo-run'

let browser: Browser
let guarded: GuardedPage
let page: Page

beforeAll(async () => {
  browser = await launchBrowser()
  guarded = await openGuardedPage(browser)
  page = guarded.page
  // The demo scenario's analyst (README "Demo sign-ins"): analysts start runs.
  await signInPage(page, inject('baseUrl'), 'analyst@cobaltridge.example', DEMO_PASSWORD)
  await demoRun(page)
}, 480_000)
afterAll(async () => { await browser?.close() })

async function waitSucceeded(id: string) {
  for (let i = 0; i < 400; i++) {
    const run = await page.evaluate(async runId => (await fetch(`/api/runs/${runId}`)).json(), id) as { state: string, errorMessage: string | null }
    if (run.state === 'succeeded') return
    if (run.state === 'failed' || run.state === 'cancelled') throw new Error(`the clustered run ended ${run.state}: ${run.errorMessage}`)
    await page.waitForTimeout(1000)
  }
  throw new Error('the clustered run did not finish in time')
}

describe('storm clustering', () => {
  it('is offered for simulated years only, is stored on the run, and the portfolio shows both curves', async () => {
    const base = inject('baseUrl')
    await page.goto(`${base}/runs`, { waitUntil: 'networkidle' })
    const clustering = page.locator('input[name="stormClustering"]')
    await page.getByLabel('Frequency').check()
    expect(await clustering.count()).toBe(0)
    await page.getByLabel('Simulated years').check()
    await clustering.waitFor()
    await page.locator('input[name="years"]').fill('2000')
    await page.locator('input[name="seed"]').fill('2121')
    await clustering.check()
    await saveScreenshot(page, 'storm-clustering-run-form')
    await page.getByRole('button', { name: 'Start run' }).click()
    await page.waitForURL(/\/runs\/[0-9a-f-]{36}$/)
    const runId = page.url().split('/').pop()!
    await waitSucceeded(runId)
    await page.reload({ waitUntil: 'networkidle' })
    await page.getByText(/storm clustering on — nearby sites share storms/).waitFor()

    await page.goto(`${base}/results/${runId}`, { waitUntil: 'networkidle' })
    const table = page.getByTestId('accumulation')
    await table.waitFor()
    const text = await table.innerText()
    expect(text).toMatch(/Aggregate loss exceeded once in 100 years/)
    expect(text).toMatch(/Aggregate loss exceeded once in 250 years/)
    expect(text).toMatch(/Tail value-at-risk, worst 1 in 250 years/)
    expect(text).toMatch(/Sites independent/)
    const dashboard = await page.evaluate(async id => (await fetch(`/api/runs/${id}/dashboard`)).json(), runId) as { exceedance: { name: string, kind: string }[], accumulation: { joint: { averageAnnualLoss: number }, sitesIndependent: { averageAnnualLoss: number } } }
    const names = dashboard.exceedance.filter(s => s.kind === 'aggregate').map(s => s.name)
    expect(names.some(n => /storm clustering$/.test(n))).toBe(true)
    expect(names.some(n => /sites independent/.test(n))).toBe(true)
    // The same losses, only relabelled between years: the average annual loss agrees (common practice: a permutation keeps the mean).
    expect(dashboard.accumulation.sitesIndependent.averageAnnualLoss).toBeCloseTo(dashboard.accumulation.joint.averageAnnualLoss, 6)
    await saveScreenshot(page, 'storm-clustering-dashboard')

    await page.goto(`${base}/runs/${runId}/financial`, { waitUntil: 'networkidle' })
    const financial = page.getByTestId('accumulation')
    await financial.waitFor()
    expect(await financial.innerText()).toMatch(/Technical premium, total/)
    expect(await financial.innerText()).toMatch(/Insured tail value-at-risk, worst 1 in 250 years/)
    await page.getByText('Aggregate exceedance: annual loss by return period, with storm clustering and with the sites independent').waitFor()
    await saveScreenshot(page, 'storm-clustering-financial')
    expect(guarded.outsideRequests).toEqual([])
  }, 600_000)
})
