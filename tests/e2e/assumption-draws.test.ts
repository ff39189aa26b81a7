// A run with assumption draws in a real browser (issue "How sure are we"): the analyst starts it
// from the run form, and the dashboard and a site page show the simulation interval and the
// assumption band apart, with the ranked sensitivity table.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchBrowser, openGuardedPage, saveScreenshot, type GuardedPage } from '../support/browser'
import { signInPage } from '../support/browser-session'
import { DEMO_PASSWORD } from '../support/demo-run'
import { waitForDrawnChart } from '../support/charts'

let browser: Browser
let guarded: GuardedPage
let page: Page
let versionLabel: string

const uncertainty = {
  entries: [
    { path: 'flashDensityFactor', distribution: { kind: 'lognormal', median: 1, sigmaLn: 0.3 }, basis: 'illustrative', note: 'browser test range' },
    { path: 'thresholds.sharp_device.u50Kv', distribution: { kind: 'lognormal', median: 70, sigmaLn: 0.25 }, basis: 'illustrative', note: 'browser test range' },
    { path: 'thresholds.grounded_pipe.u50Kv', distribution: { kind: 'lognormal', median: 100, sigmaLn: 0.25 }, basis: 'illustrative', note: 'browser test range' },
  ],
  // correlated sparking levels are taken together: one group of two, shown as a group with its members
  correlations: [{ a: 'thresholds.sharp_device.u50Kv', b: 'thresholds.grounded_pipe.u50Kv', rho: 0.5 }],
}

beforeAll(async () => {
  browser = await launchBrowser()
  guarded = await openGuardedPage(browser)
  page = guarded.page
  await signInPage(page, inject('baseUrl'), 'analyst@cobaltridge.example', DEMO_PASSWORD)
  const created = await page.evaluate(async (u) => {
    const r = await fetch('/api/assumption-sets', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ name: 'Uncertain sparking levels', description: 'browser test', parameters: { uncertainty: u } }) })
    return { status: r.status, body: await r.json() }
  }, uncertainty) as { status: number, body: { set: { name: string }, version: { version: number } } }
  expect(created.status).toBe(200)
  versionLabel = `${created.body.set.name} — version ${created.body.version.version}`
}, 120_000)
afterAll(async () => { await browser?.close() })

/** Starts the run the form holds and waits until it has succeeded; its id. */
async function startAndWait(): Promise<string> {
  await page.getByRole('button', { name: 'Start run' }).click()
  await page.waitForURL(/\/runs\/[0-9a-f-]{36}$/)
  const runId = page.url().split('/').pop()!
  let state = ''
  for (let i = 0; i < 480 && state !== 'succeeded'; i++) {
    state = (await page.evaluate(async id => (await fetch(`/api/runs/${id}`)).json(), runId) as { state: string }).state
    if (state === 'failed') throw new Error(`the run with draws ${runId} failed`)
    if (state !== 'succeeded') await page.waitForTimeout(1000)
  }
  expect(state).toBe('succeeded')
  return runId
}

describe('a run with assumption draws', () => {
  it('is started with K draws, and its results show the simulation interval and the assumption band apart, and what to calibrate next', async () => {
    await page.goto(`${inject('baseUrl')}/runs`, { waitUntil: 'networkidle' })
    await page.locator('select[name="assumptionVersionId"]').selectOption({ label: versionLabel })
    await page.getByLabel('Assumption uncertainty: K draws').check()
    await page.getByLabel('Number of assumption draws (50–500)').fill('50')
    await page.locator('input[name="targetRse"]').fill('10')
    await saveScreenshot(page, 'draws-run-form')
    const runId = await startAndWait()

    await page.goto(`${inject('baseUrl')}/results/${runId}`, { waitUntil: 'networkidle' })
    const fires = page.getByTestId('headline-tiles').locator('[data-tile="ignition"]')
    await fires.waitFor()
    expect(await fires.locator('[data-role="interval"]').textContent()).toMatch(/^95 % interval .* \/yr$/)
    expect(await fires.locator('[data-role="assumption-band"]').textContent()).toMatch(/^assumption band 5–95 % .* \/yr$/)
    expect(await page.getByTestId('headline-tiles').textContent()).toContain('across 50 draws of the uncertain assumptions')
    const sensitivity = page.getByTestId('sensitivity')
    await sensitivity.waitFor()
    expect(await sensitivity.locator('table[data-metric="expectedFires"] tbody tr').count()).toBe(2)
    // the group says that its indices are group indices and what it holds
    const groups = sensitivity.getByTestId('sensitivity-groups')
    expect(await groups.textContent()).toContain('Group indices')
    expect(await groups.locator('li').count()).toBe(1)
    expect(await groups.locator('li').textContent()).toMatch(/sparking.*;.*/i)
    // The chart of each figure is drawn, and its top entry links to the page that calibrates it: every
    // uncertain assumption of this set has one (sparking levels: impulse tests; flash density: lightning records).
    await waitForDrawnChart(page, sensitivity.locator('[data-chart-metric="expectedFires"]'))
    // the indices' base rows are half the draws (shared/engine/draws.ts), written as a count
    expect(await sensitivity.textContent()).toMatch(/from \d+ base samples/)
    expect(await sensitivity.getByTestId('sensitivity-calibration-link').first().getAttribute('href')).toMatch(/^\/calibration\/(impulse|lightning)$/)
    await saveScreenshot(page, 'draws-dashboard')

    const sites = await page.evaluate(async id => (await fetch(`/api/runs/${id}/sites`)).json(), runId) as { sites: { siteId: string }[] }
    await page.goto(`${inject('baseUrl')}/results/${runId}/sites/${sites.sites[0]!.siteId}`, { waitUntil: 'networkidle' })
    await page.getByTestId('headline-tiles').locator('[data-tile="ignition"] [data-role="assumption-band"]').waitFor()
    await page.getByTestId('sensitivity').waitFor()
    // every tank row carries its own band under its expected fires
    expect(await page.locator('[data-role="tank-assumption-band"]').count()).toBeGreaterThan(0)
    await saveScreenshot(page, 'draws-site')
    expect(guarded.outsideRequests).toEqual([])
  }, 600_000)

  it('a simulated-years run with draws shows the band of the losses at 100 and 250 years beside their simulation interval', async () => {
    await page.goto(`${inject('baseUrl')}/runs`, { waitUntil: 'networkidle' })
    await page.locator('select[name="assumptionVersionId"]').selectOption({ label: versionLabel })
    await page.getByLabel('Simulated years', { exact: true }).check()
    await page.locator('input[name="years"]').fill('2000')
    await page.getByLabel('Assumption uncertainty: K draws').check()
    await page.getByLabel('Number of assumption draws (50–500)').fill('50')
    expect(await page.locator('form').textContent()).toContain('re-simulated over at most 2,000 years')
    const runId = await startAndWait()
    await page.goto(`${inject('baseUrl')}/results/${runId}`, { waitUntil: 'networkidle' })
    const tiles = page.getByTestId('headline-tiles')
    await tiles.locator('[data-tile="loss100"]').waitFor()
    expect(await tiles.locator('[data-tile="ignition"] [data-role="assumption-band"]').textContent()).toMatch(/^assumption band 5–95 % .* \/yr$/)
    expect(await tiles.locator('[data-tile="aal"] [data-role="assumption-band"]').textContent()).toMatch(/^assumption band 5–95 % USD/)
    // The demo portfolio loses in most of 2,000 years, so the 1-in-100 loss has a band of its own.
    expect(await tiles.locator('[data-tile="loss100"] [data-role="interval"]').count()).toBe(1)
    expect(await tiles.locator('[data-tile="loss100"] [data-role="assumption-band"]').textContent()).toMatch(/^assumption band 5–95 % USD/)
    expect(await tiles.textContent()).toContain('Return-period bands: each draw re-simulated over 2,000 years')
    await saveScreenshot(page, 'draws-years-dashboard')
    expect(guarded.outsideRequests).toEqual([])
  }, 600_000)
})
