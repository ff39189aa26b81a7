// In a real browser: a viewer is not offered exports their role cannot use (README "Accounts and
// roles": viewer "read only", export is for every other role), an underwriter is, and a download the
// server refuses reads as a sentence instead of a broken file.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openGuardedPage, saveScreenshot } from '../support/browser'
import { signInPage } from '../support/browser-session'
import { DEMO_PASSWORD, DEMO_UNDERWRITER, demoRun } from '../support/demo-run'

// The demo insurer's viewer (README "Demo sign-ins"); no other browser test signs in as them.
const DEMO_VIEWER = 'viewer@cobaltridge.example'

let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

describe('what each role is offered', () => {
  it('offers a viewer no workbook on the overview and no inventory export on Sites', async () => {
    const base = inject('baseUrl')
    const { page, context, outsideRequests } = await openGuardedPage(browser)
    await signInPage(page, base, DEMO_VIEWER, DEMO_PASSWORD)
    const runId = await demoRun(page)
    await page.goto(`${base}/overview?run=${runId}`, { waitUntil: 'networkidle' })
    await page.getByTestId('headline-tiles').waitFor()
    expect(await page.getByRole('button', { name: 'Download workbook' }).count()).toBe(0)
    await saveScreenshot(page, 'role-viewer-overview')
    await page.goto(`${base}/sites`, { waitUntil: 'networkidle' })
    await page.getByRole('heading', { name: 'Sites' }).first().waitFor()
    expect(await page.getByRole('button', { name: /Export inventory/ }).count()).toBe(0)
    expect(await page.getByRole('link', { name: 'New site' }).count()).toBe(0)
    await saveScreenshot(page, 'role-viewer-sites')
    expect(outsideRequests).toEqual([])
    await context.close()
  })

  it('offers an underwriter the workbook, and a refused download says why in words', async () => {
    const base = inject('baseUrl')
    const { page, context, outsideRequests } = await openGuardedPage(browser)
    await signInPage(page, base, DEMO_UNDERWRITER, DEMO_PASSWORD)
    const runId = await demoRun(page)
    await page.goto(`${base}/overview?run=${runId}`, { waitUntil: 'networkidle' })
    const button = page.getByRole('button', { name: 'Download workbook' })
    await button.waitFor()
    // The download itself works for the underwriter…
    const download = page.waitForEvent('download')
    await button.click()
    expect((await download).suggestedFilename()).toMatch(/^stormledger-results-.*\.xlsx$/)
    // …and when the server refuses it (as it would after a role change to viewer), the page says so.
    await page.route('**/api/runs/*/export', route => route.fulfill({ status: 403, contentType: 'application/json', body: JSON.stringify({ statusCode: 403, statusMessage: 'Your role in this organisation does not allow this.' }) }))
    await button.click()
    await expect.poll(() => page.getByTestId('download-problem').innerText()).toMatch(/does not allow downloading this file/)
    await saveScreenshot(page, 'role-underwriter-refused-download')
    expect(outsideRequests).toEqual([])
    await context.close()
  })
})
