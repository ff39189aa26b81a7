// In a real browser: Compare runs offers as run B only other finished runs of run A's portfolio and
// never asks the server to compare with an empty run B (issue "Screens a practitioner reads at a glance").
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openGuardedPage, saveScreenshot } from '../support/browser'
import { signInPage } from '../support/browser-session'
import { DEMO_PASSWORD, DEMO_UNDERWRITER, demoRun } from '../support/demo-run'

let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

describe('compare runs', () => {
  it('offers only runs of the same portfolio and sends no request with an empty run', async () => {
    const base = inject('baseUrl')
    const { page, context, outsideRequests, consoleErrors } = await openGuardedPage(browser)
    await signInPage(page, base, DEMO_UNDERWRITER, DEMO_PASSWORD)
    const runId = await demoRun(page)
    const runs = await page.evaluate(async () => (await fetch('/api/runs')).json()) as Array<{ id: string, state: string, portfolioId: string }>
    const runA = runs.find(r => r.id === runId)!
    const expectedB = runs.filter(r => r.state === 'succeeded' && r.portfolioId === runA.portfolioId && r.id !== runA.id).map(r => r.id).sort()

    const compareRequests: string[] = []
    page.on('request', (r) => { if (r.url().includes('/api/runs/compare')) compareRequests.push(r.url()) })
    await page.goto(`${base}/results/compare-runs`, { waitUntil: 'networkidle' })
    await page.getByTestId('compare-run-a').selectOption(runId)
    await page.waitForTimeout(500)
    const offered = (await page.getByTestId('compare-run-b').locator('option').evaluateAll(os => os.map(o => (o as HTMLOptionElement).value))).filter(Boolean).sort()
    expect(offered).toEqual(expectedB)
    expect(compareRequests).toEqual([])
    if (!expectedB.length) expect(await page.getByTestId('compare-hint').innerText()).toContain('no other finished run')
    for (const url of compareRequests) {
      const q = new URL(url).searchParams
      expect(q.get('a')).toBeTruthy()
      expect(q.get('b')).toBeTruthy()
    }
    await saveScreenshot(page, 'compare-runs-choose')
    expect(outsideRequests).toEqual([])
    expect(consoleErrors).toEqual([])
    await context.close()
  })
})
