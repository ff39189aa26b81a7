import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchBrowser, openGuardedPage, saveScreenshot, type GuardedPage } from '../support/browser'
import { signInPage } from '../support/browser-session'
import { DEMO_PASSWORD, DEMO_UNDERWRITER, demoRun } from '../support/demo-run'
import { waitForDrawnChart } from '../support/charts'


let browser: Browser
let guarded: GuardedPage
let page: Page
let runId: string

beforeAll(async () => {
  browser = await launchBrowser()
  guarded = await openGuardedPage(browser)
  page = guarded.page
  await signInPage(page, inject('baseUrl'), DEMO_UNDERWRITER, DEMO_PASSWORD)
  runId = await demoRun(page)
}, 480_000)
afterAll(async () => { await browser?.close() })

describe('results of the demo run in a real browser', () => {
  it('overview: headline tiles, exceedance curves, drivers, map and sites × metrics heatmap, with the caution', async () => {
    await page.goto(`${inject('baseUrl')}/overview?run=${runId}`, { waitUntil: 'networkidle' })
    await page.getByTestId('headline-tiles').waitFor()
    expect(await page.getByTestId('headline-tiles').textContent()).toMatch(/\/yr/)
    expect(await waitForDrawnChart(page, page.getByTestId('exceedance-chart'))).toBeGreaterThan(2000)
    // Each curve has a legend entry and a tooltip name of its own, saying its kind (issue "Screens a practitioner reads at a glance").
    const curves = await page.getByTestId('exceedance-chart').getByTestId('chart-series-names').textContent()
    expect(curves).toContain(', aggregate (year total)')
    expect(curves).toContain(', occurrence (largest event)')
    expect(await page.getByTestId('drivers-list').count()).toBe(2)
    expect(await waitForDrawnChart(page, page.getByTestId('map-sites'), 5000, 30_000)).toBeGreaterThan(5000)
    expect(await waitForDrawnChart(page, page.getByTestId('site-metric-heatmap'))).toBeGreaterThan(2000)
    expect(await page.getByTestId('caution-notice').count()).toBeGreaterThan(0)
    await saveScreenshot(page, 'results-overview')
    expect(guarded.outsideRequests).toEqual([])
  })

  it('site results: the plan coloured by risk, tank figures, event bands and the tank heatmap', async () => {
    const sites = await page.evaluate(async id => (await fetch(`/api/runs/${id}/sites`)).json(), runId) as { sites: { siteId: string }[] }
    await page.goto(`${inject('baseUrl')}/results/${runId}/sites/${sites.sites[0]!.siteId}`, { waitUntil: 'networkidle' })
    await page.getByTestId('site-plan').waitFor()
    expect(await page.getByTestId('plan-tank').count()).toBeGreaterThan(0)
    expect(await waitForDrawnChart(page, page.getByTestId('event-bands-heatmap'))).toBeGreaterThan(2000)
    // The picture states its own precision (the run stops drawing at ±0.5 percentage points, or at 40,000 candidates).
    const precision = await page.getByTestId('event-bands-precision').textContent()
    const stated = /From (\d{1,2},\d{3}) candidate flashes: each share within ±(0\.\d+) percentage points \(one standard error\)/.exec(precision ?? '')
    expect(stated, precision ?? '').not.toBeNull()
    expect(Number(stated![1]!.replace(',', ''))).toBeGreaterThanOrEqual(8000)
    expect(Number(stated![1]!.replace(',', '')) === 40_000 || Number(stated![2]) <= 0.5).toBe(true)
    expect(await waitForDrawnChart(page, page.getByTestId('tank-heatmap'))).toBeGreaterThan(2000)
    await saveScreenshot(page, 'results-site')
    // The tank's what-if opens compared with the stored run's figures for that tank.
    await page.getByRole('link', { name: 'What-if' }).first().click()
    await page.getByTestId('whatif-stored').waitFor()
    expect(await page.getByTestId('whatif-stored').textContent()).toMatch(/stored run/)
    await saveScreenshot(page, 'results-whatif-from-run')
    expect(guarded.outsideRequests).toEqual([])
  })

  it('what-if from a run: no change before a control moves, and the run, site and tank survive a move and a reload', async () => {
    const sites = await page.evaluate(async id => (await fetch(`/api/runs/${id}/sites`)).json(), runId) as { sites: { siteId: string }[] }
    await page.goto(`${inject('baseUrl')}/results/${runId}/sites/${sites.sites[0]!.siteId}`, { waitUntil: 'networkidle' })
    await page.getByRole('link', { name: 'What-if' }).first().click()
    await page.getByTestId('whatif-stored').waitFor()
    // Before any change every difference is "no change" (the stored run is a reference beside it, not a change).
    await page.locator('[data-figure="ignition"] [data-role="difference"]').waitFor()
    expect(await page.locator('[data-role="difference"]').allInnerTexts()).toEqual(['no change', 'no change', 'no change'])
    expect(await page.locator('[data-role="stored"]').count()).toBe(3)
    await page.getByTestId('number-tankHeightM').fill('12')
    await page.waitForFunction(() => Number(new URL(location.href).searchParams.get('height')) === 12, undefined, { timeout: 5000 })
    const url = new URL(page.url())
    for (const key of ['run', 'site', 'tank']) expect(url.searchParams.get(key)).toBeTruthy()
    await page.reload({ waitUntil: 'networkidle' })
    await page.getByTestId('whatif-stored').waitFor()
    expect(Number(await page.getByTestId('number-tankHeightM').inputValue())).toBe(12)
    await saveScreenshot(page, 'results-whatif-reloaded')
    expect(guarded.outsideRequests).toEqual([])
  })

  it('compare: two sites side by side with the higher value of each row marked', async () => {
    const sites = await page.evaluate(async id => (await fetch(`/api/runs/${id}/sites`)).json(), runId) as { sites: { siteId: string }[] }
    const pair = sites.sites.slice(0, 2).map(s => s.siteId).join(',')
    await page.goto(`${inject('baseUrl')}/results/${runId}/compare?sites=${pair}`, { waitUntil: 'networkidle' })
    await page.getByTestId('compare-table').waitFor()
    expect(await page.locator('[data-testid="compare-table"] thead th').count()).toBe(3)
    expect(await page.locator('[data-highest="true"]').count()).toBeGreaterThan(0)
    await saveScreenshot(page, 'results-compare')
    expect(guarded.outsideRequests).toEqual([])
  })
})
