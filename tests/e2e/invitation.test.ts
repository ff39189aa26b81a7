// In a real browser: an admin invites an analyst → the message appears in the Mailbox → the link is
// followed → a password is set → the new person is signed in and lands on the overview with the analyst's sections.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchBrowser, openGuardedPage, saveScreenshot } from '../support/browser'
import { DEMO_PASSWORD } from '../../server/db/seed/accounts'

let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

async function signIn(page: Page, email: string | null, password: string) {
  if (email !== null) await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(password)
  await page.getByRole('button', { name: 'Sign in' }).click()
}

describe('inviting an analyst, end to end', () => {
  it('goes from the invitation to the analyst\'s overview', async () => {
    const base = inject('baseUrl')
    const invitee = `new.analyst.${Date.now().toString(36)}@cobaltridge.example`
    const { page, context, outsideRequests } = await openGuardedPage(browser)

    // A page behind sign-in sends there first, and back afterwards.
    await page.goto(`${base}/admin/invitations`)
    await page.waitForURL(/\/sign-in\?next=/)
    await signIn(page, 'admin@cobaltridge.example', DEMO_PASSWORD)
    await page.waitForURL(`${base}/admin/invitations`)
    await expect.poll(() => page.getByTestId('user-menu').innerText()).toContain('Admin')

    await page.getByLabel('E-mail').fill(invitee)
    await page.getByLabel('Role').selectOption('analyst')
    await page.getByRole('button', { name: 'Send invitation' }).click()
    await page.getByText(`Invitation sent to ${invitee}.`).waitFor()
    await saveScreenshot(page, 'admin-invitations')

    // The worker delivers through the local mail fake; the Mailbox shows it within seconds.
    await page.getByRole('link', { name: 'Mailbox' }).click()
    await page.waitForURL(`${base}/admin/mailbox`)
    const message = page.locator('li', { hasText: `to ${invitee}` })
    for (let i = 0; i < 40 && (await message.count()) === 0; i++) {
      await page.waitForTimeout(500)
      await page.getByRole('button', { name: 'Refresh' }).click()
    }
    await message.locator('summary').click()
    await expect.poll(() => message.getByTestId('mail-subject').innerText()).toBe('You are invited to Cobalt Ridge Assurance on Stormledger')
    await saveScreenshot(page, 'admin-mailbox')
    const link = await message.locator('a[href*="/invitations/"]').getAttribute('href')
    expect(link).toMatch(/\/invitations\/[\w-]{40,}$/)

    // Sign out from the user menu, then follow the link as the invitee.
    await page.getByTestId('user-menu').getByRole('button').first().click()
    await page.getByTestId('sign-out').click()
    await page.waitForURL(`${base}/sign-in`)
    await page.goto(link!)
    await page.getByRole('heading', { name: 'Join Cobalt Ridge Assurance' }).waitFor()
    await page.getByLabel('Your name').fill('Niamh Corrigan')
    await page.getByLabel('Choose a password').fill('short')
    await page.getByRole('button', { name: 'Create my account' }).click()
    await page.getByText('Use at least 12 characters.').waitFor()
    await page.getByLabel('Choose a password').fill('fibreglass under thunder')
    await page.getByLabel('The password again').fill('fibreglass under thunder')
    await saveScreenshot(page, 'accept-invitation')
    await page.getByRole('button', { name: 'Create my account' }).click()

    // Creating the account signs the new person in: they land on the overview with the analyst's sections.
    await page.waitForURL(`${base}/overview`)
    // The overview shows the organisation's dashboard, or "No run yet" before its first run finishes.
    await page.getByTestId('overview-context').waitFor()
    const sections = await page.getByTestId('section-nav').locator('a').allInnerTexts()
    expect(sections.map(s => s.trim())).toEqual(['Overview', 'Portfolios', 'Sites', 'Runs', 'Assumptions', 'Insurance', 'Capital plan', 'Calibration', 'Storms', 'Referrals'])
    expect(await page.getByTestId('current-role').innerText()).toBe('Analyst')
    expect(await page.getByTestId('overview-context').innerText()).toContain('Cobalt Ridge Assurance')
    await saveScreenshot(page, 'analyst-overview')

    // The admin pages stay out of reach: the middleware sends the analyst back to the overview.
    await page.goto(`${base}/admin/members`)
    await page.waitForURL(`${base}/overview`)
    expect(outsideRequests).toEqual([])
    await context.close()
  })
})
