// The methodology page: public, rendered from docs/methodology.md, with the assumption table.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openGuardedPage, saveScreenshot, screenshotDir } from '../support/browser'
import { CAUTION_TEXT } from '../../shared/caution'

let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

describe('methodology page', () => {
  it('explains the model with formulas, every assumption, the limits, the caution and the engine version — without sign-in', async () => {
    const { page, context, outsideRequests, consoleErrors } = await openGuardedPage(browser)
    const response = await page.goto(`${inject('baseUrl')}/methodology`, { waitUntil: 'networkidle' })
    expect(response?.status()).toBe(200)
    const body = page.getByTestId('methodology')
    expect(await body.getByRole('heading', { level: 1 }).textContent()).toContain('How Stormledger estimates')
    const headings = await body.getByRole('heading', { level: 2 }).allTextContents()
    expect(headings.join(' | ')).toContain('What the model leaves out')
    expect(headings.join(' | ')).toContain('Every assumption and its source')
    // Formulas are HTML (sub/superscripts), no math font or script from outside: Rusk's 38.8 Ω form (IEEE Std 1410).
    expect(await body.locator('.formula').count()).toBeGreaterThan(10)
    expect(await body.textContent()).toContain('V ≈ 38.8 · I · h / y')
    // The assumption table: one row per engine parameter (the engine's metadata has more than 30).
    const rows = body.locator('.methodology-table tbody tr')
    expect(await rows.count()).toBeGreaterThan(30)
    expect(await body.locator('.methodology-table').textContent()).toContain('IEEE Std 1410')
    // The caution wording (shared/caution.ts) and the engine version.
    expect(await body.textContent()).toContain(CAUTION_TEXT.short)
    expect((await body.locator('[data-engine-version]').textContent())?.trim().length).toBeGreaterThan(0)
    await saveScreenshot(page, 'methodology')
    await page.locator('h2', { hasText: 'Where a flash attaches' }).scrollIntoViewIfNeeded()
    await page.screenshot({ path: `${screenshotDir}/methodology-formulas.png` })
    expect(outsideRequests).toEqual([])
    expect(consoleErrors).toEqual([])
    await context.close()
  })
})
