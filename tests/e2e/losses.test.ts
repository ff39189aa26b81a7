// In a real browser, on the demo run: no simulated event costs more than the tanks it burned,
// property damage and business interruption are shown apart, and an underwriter adds a layer on
// the portfolio and reads its price from the stored events.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchBrowser, openGuardedPage, saveScreenshot, type GuardedPage } from '../support/browser'
import { signInPage } from '../support/browser-session'
import { DEMO_PASSWORD, DEMO_UNDERWRITER, demoRun } from '../support/demo-run'

let browser: Browser
let guarded: GuardedPage
let page: Page
let runId: string

interface LargestEvent { groundUp: number, groundUpPd: number, valueAtRisk: number | null, tanks: { tag: string }[] }

beforeAll(async () => {
  browser = await launchBrowser()
  guarded = await openGuardedPage(browser)
  page = guarded.page
  await signInPage(page, inject('baseUrl'), DEMO_UNDERWRITER, DEMO_PASSWORD)
  runId = await demoRun(page)
}, 480_000)
afterAll(async () => { await browser?.close() })

describe('losses a practitioner can defend', () => {
  it('largest events stay within the value of the tanks they burned; PD and BI apart on the financial view and the overview', async () => {
    const base = inject('baseUrl')
    await page.goto(`${base}/runs/${runId}/financial`, { waitUntil: 'networkidle' })
    await page.getByTestId('largest-event').first().waitFor()
    // Every listed event (the 50 largest of the run): ground-up ≤ replacement + contents + clean-up + interruption of its tanks.
    const view = await page.evaluate(async id => (await fetch(`/api/runs/${id}/financial`)).json(), runId) as { hasSplit: boolean, largestEvents: LargestEvent[] }
    expect(view.hasSplit).toBe(true)
    expect(view.largestEvents.length).toBeGreaterThan(0)
    for (const e of view.largestEvents) {
      expect(e.valueAtRisk).not.toBeNull()
      expect(e.groundUp).toBeLessThanOrEqual(e.valueAtRisk! * (1 + 1e-9))
      expect(e.groundUpPd).toBeLessThanOrEqual(e.groundUp)
      expect(e.tanks.length).toBeGreaterThan(0)
    }
    // The same on screen, row by row.
    const rows = page.getByTestId('largest-event')
    for (let i = 0; i < await rows.count(); i++) {
      const groundUp = Number(await rows.nth(i).getByTestId('event-ground-up').getAttribute('data-value'))
      const valueAtRisk = Number(await rows.nth(i).getByTestId('event-value-at-risk').getAttribute('data-value'))
      expect(groundUp).toBeLessThanOrEqual(valueAtRisk * (1 + 1e-9))
    }
    expect(await page.getByTestId('split-ground-up-aal').innerText()).toMatch(/PD USD [\d,]+ \/yr · BI USD [\d,]+ \/yr/)
    await saveScreenshot(page, 'losses-financial-view')

    await page.goto(`${base}/overview?run=${runId}`, { waitUntil: 'networkidle' })
    await page.getByTestId('headline-tiles').waitFor()
    expect(await page.locator('[data-tile="aal"]').innerText()).toMatch(/property damage USD [\d,]+ · business interruption USD [\d,]+/)
    expect(guarded.outsideRequests).toEqual([])
  })

  it('an underwriter adds a layer to the terms and reads its expected loss and premium', async () => {
    const base = inject('baseUrl')
    await page.goto(`${base}/runs/${runId}/financial`, { waitUntil: 'networkidle' })
    await page.getByRole('link', { name: 'Add layers to the terms' }).click()
    await page.waitForURL(/\/insurance\/[0-9a-f-]{36}/)
    await page.getByRole('button', { name: 'Add a layer' }).waitFor()
    await page.getByRole('button', { name: 'Add a layer' }).click()
    await page.getByLabel('Layer 1 name').fill('Cat XoL 250k xs 100k')
    await page.getByLabel('Layer 1 attachment').fill('100000')
    await page.getByLabel('Layer 1 limit').fill('250000')
    await page.getByRole('button', { name: 'Save terms' }).click()
    // The demo run recorded this version: saving makes the next one.
    await page.getByText(/Saved as version \d+/).waitFor()
    await page.waitForURL(/version=[0-9a-f-]{36}/)
    const versionId = new URL(page.url()).searchParams.get('version')!
    await saveScreenshot(page, 'losses-layer-editor')

    await page.goto(`${base}/runs/${runId}/financial?termsVersionId=${versionId}`, { waitUntil: 'networkidle' })
    const row = page.getByTestId('layer-row')
    await row.first().waitFor()
    expect(await row.count()).toBe(1)
    expect(await row.first().innerText()).toContain('Cat XoL 250k xs 100k')
    expect(await row.first().getByTestId('layer-premium').innerText()).toMatch(/USD [\d,]+ \/yr/)
    const view = await page.evaluate(async ([id, v]) => (await fetch(`/api/runs/${id}/financial?termsVersionId=${v}`)).json(), [runId, versionId] as const) as { layers: { expectedLoss: number, premium: { premium: number }, summary: { occurrenceCurve: { loss: number }[] } }[] }
    const layer = view.layers[0]!
    // A layer never pays more than its limit on one event; its premium covers at least its expected loss.
    expect(Math.max(0, ...layer.summary.occurrenceCurve.map(p => p.loss))).toBeLessThanOrEqual(250_000)
    expect(layer.premium.premium).toBeGreaterThanOrEqual(layer.expectedLoss)
    await saveScreenshot(page, 'losses-layer-priced')
    expect(guarded.outsideRequests).toEqual([])
    expect(guarded.consoleErrors).toEqual([])
  })
})
