// In a real browser, as an asset manager (README "Accounts and roles": builds capital plans and
// mitigation scenarios): a bulk add with "Taller than" cleared, a mast placed on a site chosen by name
// at East/North positions in m, messages beside the fields, and who evaluates said on the page.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openGuardedPage, saveScreenshot } from '../support/browser'
import { signInPage } from '../support/browser-session'
import { DEMO_PASSWORD } from '../support/demo-run'

// The demo operator's asset manager (README "Demo sign-ins"); the other capital-plan test works as Dunmere's admin.
const ASSET_MANAGER = 'asset.manager@sablefork.example'

let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

describe('capital plan forms', () => {
  it('adds shields with no height filter and a mast on a picked site, with field messages', async () => {
    const base = inject('baseUrl')
    const { page, context, outsideRequests, consoleErrors } = await openGuardedPage(browser)
    await signInPage(page, base, ASSET_MANAGER, DEMO_PASSWORD)
    await page.goto(`${base}/capital-plan`, { waitUntil: 'networkidle' })

    // Clearing "Taller than (m)" means any height (it used to answer "Validation Error").
    const shield = await page.getByTestId('add-option').locator('option', { hasText: 'shield' }).first().getAttribute('value')
    await page.getByTestId('add-option').selectOption(shield!)
    await page.getByLabel('Taller than (m)').fill('')
    await page.getByTestId('add-actions').click()
    await expect.poll(() => page.getByTestId('capital-message').innerText()).toMatch(/^\d[\d,]* actions? added\.$/)

    // A mast: a site picker (no internal id to type) and positions East/North in m.
    const mast = await page.getByTestId('add-option').locator('option', { hasText: 'mast' }).first().getAttribute('value')
    await page.getByTestId('add-option').selectOption(mast!)
    expect(await page.getByLabel(/Site id/).count()).toBe(0)
    await expect.poll(() => page.getByTestId('add-site').locator('option').count()).toBeGreaterThan(1)
    await page.getByTestId('add-actions').click()
    const siteField = page.getByTestId('add-site').locator('xpath=..')
    await expect.poll(() => siteField.innerText()).toContain('Choose the site the mast stands on.')
    await page.getByTestId('add-site').selectOption({ index: 1 })
    await page.getByLabel('East (m)').fill('40')
    await page.getByLabel('North (m)').fill('')
    await page.getByTestId('add-actions').click()
    await expect.poll(() => page.getByTestId('add-mast-north').locator('xpath=..').innerText()).toContain('north position in m')
    await page.getByLabel('North (m)').fill('20')
    await page.getByTestId('add-actions').click()
    await expect.poll(() => page.getByTestId('capital-message').innerText()).toBe('1 action added.')

    // Evaluating runs simulations: an asset manager is told who does it instead of a missing button.
    expect(await page.getByTestId('evaluate').count()).toBe(0)
    expect(await page.getByTestId('evaluate-who').innerText()).toContain('admins and analysts')
    await saveScreenshot(page, 'capital-plan-asset-manager')
    expect(outsideRequests).toEqual([])
    expect(consoleErrors).toEqual([])
    await context.close()
  })
})
