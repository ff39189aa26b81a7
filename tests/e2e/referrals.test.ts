// In a real browser: an underwriter raises a referral on a site and gives it to an asset manager,
// who gets the e-mail, follows its link, replies and moves it to "in review"; the underwriter's
// list of open referrals shows it with the reply.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openGuardedPage, saveScreenshot } from '../support/browser'
import { signInPage } from '../support/browser-session'
import { createMember, createOrganisation } from '../support/accounts'
import { testPool } from '../support/db'
import { waitForMail } from '../support/mail'

const pool = testPool()
let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close(); await pool.end() })

describe('referrals in the browser', () => {
  it('raise, assign, e-mail, reply, move to in review, see it in the open list', async () => {
    const base = inject('baseUrl')
    const org = await createOrganisation(pool, 'Browser Referral Insurer', 'insurer')
    const { rows: [site] } = await pool.query(
      `INSERT INTO sites (organisation_id, external_id, name, latitude_deg, longitude_deg, flash_density_per_km2_yr) VALUES ($1, 'BR-1', 'Kestrel Wash Battery', 32, -102, 4) RETURNING id`, [org])
    const underwriter = await createMember(pool, org, 'underwriter')
    const manager = await createMember(pool, org, 'asset_manager')
    await pool.query(`UPDATE users SET name = 'Orla Fenwick' WHERE id = $1`, [manager.userId])

    const u = await openGuardedPage(browser)
    await signInPage(u.page, base, underwriter.email)
    await u.page.goto(`${base}/sites/${site.id}`, { waitUntil: 'networkidle' })
    const since = new Date()
    await u.page.locator('#note-body').fill('Refer: the condensate tanks have no shields. Please send the bonding survey.')
    await u.page.getByTestId('note-assignee').selectOption({ label: 'Orla Fenwick' })
    await u.page.getByTestId('note-due').fill('2027-01-15')
    await u.page.getByRole('button', { name: 'Save referral' }).click()
    await u.page.getByTestId('site-note').first().waitFor({ state: 'visible' })
    expect(await u.page.getByTestId('site-note').first().innerText()).toMatch(/Open[\s\S]*Assigned to Orla Fenwick[\s\S]*due 2027-01-15 \(UTC\)/)

    const mail = await waitForMail(pool, manager.email, since)
    expect(mail.subject).toBe('Referral for you: Kestrel Wash Battery, due 2027-01-15')
    const path = /https?:\/\/[^\s/]+(\/referrals\?note=[\w-]+)/.exec(mail.body)?.[1]
    expect(path, mail.body).toBeTruthy()
    const m = await openGuardedPage(browser)
    await signInPage(m.page, base, manager.email)
    await m.page.goto(`${base}${path!}`, { waitUntil: 'networkidle' })
    const card = m.page.getByTestId('site-note').first()
    await card.waitFor({ state: 'visible' })
    expect(await card.innerText()).toContain('Kestrel Wash Battery')
    await card.getByLabel('Reply').fill('Survey booked for Tuesday.')
    await card.getByTestId('referral-reply-send').click()
    await card.getByTestId('referral-reply').first().waitFor({ state: 'visible' })
    await card.getByTestId('referral-status-select').selectOption('in_review')
    await m.page.locator('[data-testid="site-note"][data-status="in_review"]').waitFor({ state: 'visible' })
    expect(await card.getByTestId('referral-assignee-select').count()).toBe(0) // only underwriters and admins reassign
    await saveScreenshot(m.page, 'referral-assignee')

    await u.page.goto(`${base}/referrals`, { waitUntil: 'networkidle' })
    const listed = u.page.getByTestId('referrals-list').getByTestId('site-note').first()
    await listed.waitFor({ state: 'visible' })
    expect(await listed.innerText()).toMatch(/In review[\s\S]*Survey booked for Tuesday\./)
    await saveScreenshot(u.page, 'referrals-list')
    expect(u.outsideRequests).toEqual([])
    expect(m.outsideRequests).toEqual([])
    await u.context.close()
    await m.context.close()
  })
})
