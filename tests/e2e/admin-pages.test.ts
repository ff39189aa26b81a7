// In a real browser: the admin pages of a seeded organisation, and what a viewer is kept from.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openGuardedPage, saveScreenshot } from '../support/browser'
import { DEMO_PASSWORD } from '../../server/db/seed/accounts'

let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

describe('admin pages', () => {
  it('lists the members, and the audit log filters by entity', async () => {
    const base = inject('baseUrl')
    const { page, context, outsideRequests, consoleErrors } = await openGuardedPage(browser)
    await page.goto(`${base}/sign-in`)
    await page.getByLabel('E-mail').fill('admin@dunmere.example')
    await page.getByLabel('Password').fill(DEMO_PASSWORD)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.waitForURL(`${base}/overview`)

    await page.getByRole('link', { name: 'Admin' }).first().click()
    await page.getByRole('link', { name: /^Members/ }).first().click()
    await page.waitForURL(`${base}/admin/members`)
    const rows = page.getByTestId('members-table').locator('tbody tr')
    // The demo's five members, plus any a browser test of invitations added before this file ran.
    await expect.poll(() => rows.count()).toBeGreaterThanOrEqual(5)
    expect(await rows.allInnerTexts()).toEqual(expect.arrayContaining([expect.stringContaining('asset.manager@dunmere.example')]))
    await saveScreenshot(page, 'admin-members')

    await page.goto(`${base}/admin/audit`)
    await expect.poll(() => page.getByTestId('audit-table').innerText()).toContain('Signed in')
    await page.getByLabel('Entity').selectOption('account')
    await page.getByRole('button', { name: 'Filter' }).click()
    await page.waitForURL(/entity=account/)
    await saveScreenshot(page, 'admin-audit')

    await page.goto(`${base}/profile`)
    await page.getByRole('heading', { name: 'Change password' }).waitFor()
    await saveScreenshot(page, 'profile')
    expect(outsideRequests).toEqual([])
    expect(consoleErrors).toEqual([])
    await context.close()
  })

  it('shows a viewer no Admin section and sends them away from admin pages', async () => {
    const base = inject('baseUrl')
    const { page, context } = await openGuardedPage(browser)
    await page.goto(`${base}/admin/audit`)
    await page.waitForURL(/\/sign-in\?next=(%2F|\/)admin(%2F|\/)audit/)
    await page.getByLabel('E-mail').fill('viewer@sablefork.example')
    await page.getByLabel('Password').fill(DEMO_PASSWORD)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.waitForURL(`${base}/overview`)
    const sections = (await page.getByTestId('section-nav').locator('a').allInnerTexts()).map(s => s.trim())
    expect(sections).not.toContain('Admin')
    expect(sections).not.toContain('Calibration')
    expect(await page.getByTestId('current-role').innerText()).toBe('Viewer')
    await context.close()
  })
})
