// In a real browser: a person makes an API token on the profile page, sees its secret once, a
// script (fetch from the test, no cookie) calls the API with it, the person revokes it, and the
// script's next call is refused. Uses an account no other browser test signs in as.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openGuardedPage, saveScreenshot } from '../support/browser'
import { DEMO_PASSWORD } from '../../server/db/seed/accounts'

let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

describe('API tokens on the profile', () => {
  it('makes a token, shows it once, works for a script, and stops once revoked', async () => {
    const base = inject('baseUrl')
    const { page, context, outsideRequests, consoleErrors } = await openGuardedPage(browser)
    await page.goto(`${base}/sign-in`)
    await page.getByLabel('E-mail').fill('analyst@quillfeather.example')
    await page.getByLabel('Password').fill(DEMO_PASSWORD)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.waitForURL(`${base}/overview`)

    await page.goto(`${base}/profile`)
    await page.getByRole('heading', { name: 'API tokens' }).waitFor()
    await page.getByLabel('Name (what uses it)').fill('browser test script')
    await page.getByRole('button', { name: 'Create token' }).click()
    const secretBox = page.getByTestId('api-token-secret-value')
    await secretBox.waitFor()
    const secret = (await secretBox.innerText()).trim()
    expect(secret).toMatch(/^slk_[A-Za-z0-9_-]{43}$/) // prefix + 32 random bytes in base64url (RFC 4648 §5)
    const row = page.locator('[data-testid="api-token-row"][data-name="browser test script"]')
    await row.waitFor()
    // The list shows the last four characters only, never the secret (the rule of the issue).
    expect(await row.innerText()).toContain(secret.slice(-4))
    expect(await page.getByTestId('api-token-table').innerText()).not.toContain(secret)
    await saveScreenshot(page, 'profile-api-token')

    // A script: no cookie, only the bearer token.
    const script = () => fetch(`${base}/api/portfolios`, { headers: { authorization: `Bearer ${secret}` } })
    const ok = await script()
    expect(ok.status).toBe(200)
    expect(Array.isArray(await ok.json())).toBe(true)

    // After a reload the secret is gone from the page; the last use is listed.
    await page.reload()
    await row.waitFor()
    expect(await page.getByTestId('api-token-secret').count()).toBe(0)
    expect(await row.innerText()).not.toContain('Never')

    // The organisation's admin sees it, with its owner, under Admin → Members.
    const adminSide = await openGuardedPage(browser)
    await adminSide.page.goto(`${base}/sign-in`)
    await adminSide.page.getByLabel('E-mail').fill('admin@quillfeather.example')
    await adminSide.page.getByLabel('Password').fill(DEMO_PASSWORD)
    await adminSide.page.getByRole('button', { name: 'Sign in' }).click()
    await adminSide.page.waitForURL(`${base}/overview`)
    await adminSide.page.goto(`${base}/admin/members`)
    const adminRow = adminSide.page.getByTestId('admin-api-tokens').locator('[data-testid="api-token-row"][data-name="browser test script"]')
    await adminRow.waitFor()
    expect(await adminRow.innerText()).toContain('analyst@quillfeather.example')
    expect(adminSide.outsideRequests).toEqual([])
    expect(adminSide.consoleErrors).toEqual([])
    await adminSide.context.close()

    await row.getByRole('button', { name: 'Revoke browser test script' }).click()
    // Revoking asks first, in the one confirmation dialog.
    const dialog = page.getByRole('dialog', { name: 'Revoke the token “browser test script”?' })
    await dialog.waitFor()
    await dialog.getByRole('button', { name: 'Revoke' }).click()
    await expect.poll(() => row.count()).toBe(0)
    const refused = await script()
    expect(refused.status).toBe(401)
    expect(((await refused.json()) as { message: string }).message).toMatch(/revoked/)

    expect(outsideRequests).toEqual([])
    expect(consoleErrors).toEqual([])
    await context.close()
  })
})
