// In a real browser: a person who already has an account opens an invitation from a second
// organisation while signed out; the page asks for their password, signs them in and accepts, and
// they land in the organisation just joined. Before that, nothing had been added.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openGuardedPage, saveScreenshot } from '../support/browser'
import { signInPage } from '../support/browser-session'
import { testPool } from '../support/db'
import { linkIn, waitForMail } from '../support/mail'
import { DEMO_PASSWORD } from '../../server/db/seed/accounts'

const pool = testPool()
let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close(); await pool.end() })

/** Signs an admin in on a fresh page and sends an invitation from there; returns the e-mailed path. */
async function inviteAs(admin: string, email: string, role: string): Promise<string> {
  const { page, context } = await openGuardedPage(browser)
  await signInPage(page, inject('baseUrl'), admin, DEMO_PASSWORD)
  const since = new Date()
  const status = await page.evaluate(async ([e, r]) => (await fetch('/api/invitations', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: e, role: r }) })).status, [email, role] as const)
  expect(status).toBe(201)
  await context.close()
  return linkIn((await waitForMail(pool, email, since)).body, '/invitations/').path
}

describe('an invitation to an existing account', () => {
  it('is accepted only after the person signs in on the invitation page', async () => {
    const base = inject('baseUrl')
    const email = `consent.${Date.now().toString(36)}@dunmere.example`
    const password = 'consent before membership'
    // The account first exists in one organisation (made through its own invitation).
    const first = await inviteAs('admin@dunmere.example', email, 'viewer')
    const made = await fetch(`${base}/api${first.replace('/invitations/', '/invitations/accept/')}`, {
      method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ name: 'Consent Tester', password }),
    })
    expect(made.status).toBe(200)

    const second = await inviteAs('admin@sablefork.example', email, 'analyst')
    const { page, outsideRequests } = await openGuardedPage(browser)
    await page.goto(`${base}${second}`, { waitUntil: 'networkidle' })
    await page.getByRole('heading', { name: 'Join Sablefork Petroleum' }).waitFor()
    await page.getByRole('button', { name: 'Sign in and accept' }).click()
    await page.getByText('Enter your password to accept.').waitFor()
    await page.getByLabel('Your password').fill('not my password at all')
    await page.getByRole('button', { name: 'Sign in and accept' }).click()
    await page.getByText('That password does not match the invited account.').first().waitFor()
    const before = await pool.query(`SELECT count(*)::int AS n FROM memberships m JOIN users u ON u.id = m.user_id WHERE u.email = $1`, [email])
    expect(before.rows[0].n).toBe(1)

    await page.getByLabel('Your password').fill(password)
    await saveScreenshot(page, 'accept-invitation-existing-account')
    await page.getByRole('button', { name: 'Sign in and accept' }).click()
    await page.waitForURL(`${base}/overview`)
    await expect.poll(() => page.getByTestId('current-role').innerText()).toBe('Analyst')
    expect(await page.getByTestId('overview-context').innerText()).toContain('Sablefork Petroleum')
    expect(outsideRequests).toEqual([])
    await pool.query(`DELETE FROM sign_in_attempts WHERE email = $1`, [email])
  })
})
