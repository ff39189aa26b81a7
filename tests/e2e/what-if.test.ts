// The tank what-if: live figures from the engine as the controls move.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchBrowser, openGuardedPage, saveScreenshot, type GuardedPage } from '../support/browser'
import { waitForDrawnChart } from '../support/charts'

let browser: Browser
let g: GuardedPage
beforeAll(async () => {
  browser = await launchBrowser()
  g = await openGuardedPage(browser)
  await g.page.goto(`${inject('baseUrl')}/what-if`, { waitUntil: 'networkidle' })
  await g.page.locator('[data-figure="sparking"] [data-role="value"]').waitFor()
})
afterAll(async () => { await g?.context.close(); await browser?.close() })

/** The quadrature figure shown for an event (the exact number behind the formatted text). */
async function figure(page: Page, key: 'sparking' | 'direct' | 'ignition'): Promise<number> {
  return Number(await page.locator(`[data-figure="${key}"] [data-role="value"]`).getAttribute('data-value'))
}

/** Sets a control and waits until the shown figure differs from `before`. */
async function moveAndWait(page: Page, testId: string, value: string, before: number): Promise<number> {
  await page.getByTestId(testId).fill(value)
  await page.waitForFunction(([b]) => Number(document.querySelector('[data-figure="sparking"] [data-role="value"]')?.getAttribute('data-value')) !== b, [before], { timeout: 5000 })
  return figure(page, 'sparking')
}

describe('tank what-if', () => {
  it('shows the three frequencies with return periods, a drawn heatmap and the compute time', async () => {
    const { page } = g
    for (const key of ['sparking', 'direct', 'ignition'] as const) {
      expect(await figure(page, key)).toBeGreaterThan(0)
      expect(await page.locator(`[data-figure="${key}"]`).textContent()).toMatch(/\/yr.*(once in|times a year)/)
    }
    expect(await waitForDrawnChart(page, page.getByTestId('tank-heatmap'))).toBeGreaterThan(2000)
    expect(await page.getByTestId('whatif-timing').textContent()).toMatch(/Recomputed in [\d.,]+ ms/)
    // The Monte Carlo check arrives a moment later, with its interval.
    await page.waitForFunction(() => /\(.+–.+\)/.test(document.querySelector('[data-figure="sparking"] [data-role="check"]')?.textContent ?? ''), undefined, { timeout: 15_000 })
  })

  it('gives more induced sparking for a taller tank and for a higher flash density, in well under a second', async () => {
    const { page } = g
    const start = await figure(page, 'sparking')
    // MODEL.md §3: the induced potential grows with the part's height (V = Kc·I·h/y), so a taller
    // tank sparks from flashes further away: more sparking.
    const taller = await moveAndWait(page, 'number-tankHeightM', '12', start)
    expect(taller).toBeGreaterThan(start)
    const ms = Number((await page.getByTestId('compute-ms').textContent())!.replace(/,/g, ''))
    expect(ms).toBeLessThan(500)
    // MODEL.md §1 and §6: frequencies are proportional to the ground flash density, so doubling it doubles sparking.
    const ng = Number(await page.getByTestId('number-flashDensity').inputValue())
    const doubled = await moveAndWait(page, 'slider-flashDensity', String(ng * 2), taller)
    expect(doubled / taller).toBeCloseTo(2, 6)
    // A shield rated 60 kA removes the sparking of every flash up to 60 kA (MODEL.md §4): less sparking.
    const shielded = await moveAndWait(page, 'number-shieldKa', '60', doubled)
    expect(shielded).toBeLessThan(doubled)
    expect(await page.locator('[data-figure="sparking"] [data-role="difference"]').textContent()).toMatch(/^[+−]\d/)
  })

  it('moves with the keyboard', async () => {
    const { page } = g
    const before = await figure(page, 'sparking')
    await page.getByTestId('slider-u50Kv').focus()
    // A higher sparking level means fewer sparks (MODEL.md §4: p = Φ(ln(V/U50)/σ) falls as U50 rises).
    for (let k = 0; k < 10; k++) await page.keyboard.press('ArrowRight')
    await page.waitForFunction(([b]) => Number(document.querySelector('[data-figure="sparking"] [data-role="value"]')?.getAttribute('data-value')) !== b, [before])
    expect(await figure(page, 'sparking')).toBeLessThan(before)
  })

  it('saves the changed inputs as a mitigation option, listed on the page', async () => {
    const { page } = g
    await page.getByTestId('option-label').fill('Shield rated 60 kA')
    await page.getByTestId('save-option').click()
    const saved = page.locator('[data-role="saved-option"]')
    await saved.first().waitFor()
    expect(await saved.count()).toBe(1)
    expect(await saved.first().textContent()).toContain('Shield rated 60 kA')
    const json = JSON.parse((await saved.first().locator('[data-role="option-json"]').textContent())!)
    expect(json.parameters.shieldKa).toBe(60)
    expect(json.changes.map((c: { key: string }) => c.key)).toContain('shieldKa')
    // The address reproduces the inputs (shareable link).
    await page.waitForFunction(() => location.search.includes('shield=60'))
  })

  it('asks nothing of the internet and logs no errors', async () => {
    await saveScreenshot(g.page, 'what-if')
    expect(g.outsideRequests).toEqual([])
    expect(g.consoleErrors).toEqual([])
  })
})
