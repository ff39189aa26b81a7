// In a real browser (issue "Screens a practitioner reads at a glance", "Navigation" and "Plain
// words"): viewers read terms and reach each run's financial view from Insurance; Methodology opens
// inside the app shell when signed in; the audit log shows before/after as "field: old → new" lines.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openGuardedPage, saveScreenshot } from '../support/browser'
import { signInPage } from '../support/browser-session'
import { DEMO_PASSWORD, demoRun } from '../support/demo-run'

// Demo sign-ins (README): the insurer's viewer (its book has demo terms) and the operator's admin.
const VIEWER = 'viewer@cobaltridge.example'
const ADMIN = 'admin@dunmere.example'
let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

describe('reading and finding one’s way', () => {
  it('a viewer opens Insurance from the rail, reads the terms and a run’s financial view', async () => {
    const base = inject('baseUrl')
    const { page, context, outsideRequests, consoleErrors } = await openGuardedPage(browser)
    await signInPage(page, base, VIEWER, DEMO_PASSWORD)
    const runId = await demoRun(page)
    await page.goto(`${base}/overview`, { waitUntil: 'networkidle' })
    await page.getByTestId('section-nav').getByRole('link', { name: 'Insurance' }).click()
    await page.waitForURL(`${base}/insurance`)
    const terms = page.getByRole('region', { name: 'Terms sets' }).locator('tbody tr')
    await terms.first().waitFor()
    // Read only: no form to put terms on a portfolio.
    expect(await page.getByRole('heading', { name: 'Put terms on a portfolio' }).count()).toBe(0)
    const link = page.locator(`[data-testid="financial-runs"] a[href="/runs/${runId}/financial"]`)
    await link.waitFor()
    await saveScreenshot(page, 'insurance-viewer')
    await terms.first().getByRole('link').click()
    await page.waitForURL(/\/insurance\/[0-9a-f-]{36}/)
    await page.getByRole('region', { name: 'Terms per site' }).waitFor()
    await page.goBack()
    await link.click()
    await page.waitForURL(`${base}/runs/${runId}/financial`)
    await page.getByTestId('figure-ground-up-aal').waitFor()
    expect(outsideRequests).toEqual([])
    expect(consoleErrors).toEqual([])
    await context.close()
  })

  it('Methodology sits inside the app shell when signed in, on the public frame when not', async () => {
    const base = inject('baseUrl')
    const signedOut = await openGuardedPage(browser)
    await signedOut.page.goto(`${base}/methodology`, { waitUntil: 'networkidle' })
    await signedOut.page.getByTestId('methodology').waitFor()
    expect(await signedOut.page.getByTestId('section-nav').count()).toBe(0)
    await signedOut.context.close()

    const { page, context, consoleErrors } = await openGuardedPage(browser)
    await signInPage(page, base, VIEWER, DEMO_PASSWORD)
    await page.goto(`${base}/methodology`, { waitUntil: 'networkidle' })
    await page.getByTestId('methodology').waitFor()
    await page.getByTestId('section-nav').waitFor()
    await page.getByTestId('section-nav').getByRole('link', { name: 'Overview' }).waitFor()
    expect(consoleErrors).toEqual([])
    await context.close()
  })

  it('the audit log writes a change as "field: old → new"', async () => {
    const base = inject('baseUrl')
    const { page, context, consoleErrors } = await openGuardedPage(browser)
    await signInPage(page, base, ADMIN, DEMO_PASSWORD)
    const runId = await demoRun(page)
    const oldName = await page.evaluate(async (id) => {
      const run = await (await fetch(`/api/runs/${id}`)).json() as { name: string }
      const patch = (name: string) => fetch(`/api/runs/${id}`, { method: 'PATCH', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ name }) })
      await patch('Audit-log test name')
      await patch(run.name) // and back, for the other browser tests
      return run.name
    }, runId)
    await page.goto(`${base}/admin/audit?entity=run`, { waitUntil: 'networkidle' })
    const lines = await page.locator('[data-testid="audit-table"] [data-role="changes"] li').allInnerTexts()
    expect(lines).toContain(`name: ${oldName} → Audit-log test name`)
    expect(lines).toContain(`name: Audit-log test name → ${oldName}`)
    // No JSON left in the column.
    expect(lines.some(l => /^[[{]/.test(l))).toBe(false)
    await saveScreenshot(page, 'admin-audit-readable')
    expect(consoleErrors).toEqual([])
    await context.close()
  })
})
