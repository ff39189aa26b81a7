// After the storm in a real browser (issue 22): a provider's feed replays a storm over a site, the
// asset manager who asked for alerts gets the e-mail, opens the report from its link and sees the
// tanks ranked and the flashes drawn on the map.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { createMember, createOrganisation, memberClient, Client } from '../support/accounts'
import { launchBrowser, openGuardedPage, saveScreenshot } from '../support/browser'
import { testPool } from '../support/db'
import { waitForMail } from '../support/mail'
import { replayFeed } from '../../server/storms/fake-feed'

const pool = testPool()
let browser: Browser
let managerEmail: string
let managerCookie: string
let token: string
let analystCookie: string
const SITE = { lat: 32.2, lon: -101.9 }

beforeAll(async () => {
  browser = await launchBrowser()
  const org = await createOrganisation(pool, 'Storm Browser Operator')
  const site = await pool.query(`INSERT INTO sites (organisation_id, external_id, name, latitude_deg, longitude_deg, flash_density_per_km2_yr) VALUES ($1, 'SB-1', 'Mesa tank battery', $2, $3, 3) RETURNING id`, [org, SITE.lat, SITE.lon])
  for (const [tag, x] of [['MB-1', 0], ['MB-2', 12], ['MB-3', 24]] as const) {
    const t = await pool.query(`INSERT INTO tanks (site_id, external_id, tag, material, height_m, diameter_m, x_m, y_m, contents, flammable_vapour_space, replacement_value, contents_value, cleanup_cost, interruption_cost)
      VALUES ($1, $2, $2, 'frp', 7, 3.5, $3, 0, 'crude', true, 150000, 90000, 40000, 60000) RETURNING id`, [site.rows[0].id, tag, x])
    await pool.query(`INSERT INTO tank_components (tank_id, component_class, count, height_m) VALUES ($1, 'sharp_device', 1, 5)`, [t.rows[0].id])
  }
  const admin = await memberClient(pool, org, 'admin')
  analystCookie = (await memberClient(pool, org, 'analyst')).cookie
  token = (await (await admin.post('/api/storms/feeds', { name: 'Browser test provider' })).json() as { token: string }).token
  await admin.request('PUT', '/api/storms/alert-settings', { ignitionThreshold: 0.02 })
  const m = await createMember(pool, org, 'asset_manager')
  managerEmail = m.email
  const manager = new Client()
  await manager.signIn(m.email)
  managerCookie = manager.cookie
  await manager.request('PUT', '/api/storms/alert-subscription', { subscribed: true })
})
afterAll(async () => { await browser?.close(); await pool.end() })

/** A storm: one strong flash 30 m from MB-1 (well located), and weaker ones around the basin. */
function stormCsv(): string {
  const lines = ['time,latitude,longitude,peak_current_ka,type,location_error_km']
  lines.push(`2026-06-20T19:02:00.000Z,${(SITE.lat + 30 / 111_195).toFixed(6)},${SITE.lon.toFixed(6)},-55.0,ground,0.05`)
  for (let i = 0; i < 30; i++) lines.push(`2026-06-20T19:${String(3 + i).padStart(2, '0')}:10.000Z,${(SITE.lat + 0.02 + i * 0.003).toFixed(5)},${(SITE.lon - 0.05 + i * 0.004).toFixed(5)},-${(10 + i).toFixed(1)},${i % 4 === 0 ? 'cloud' : 'ground'},0.3`)
  return `${lines.join('\n')}\n`
}

describe('after the storm in a real browser', () => {
  it('the replayed feed alerts the asset manager; the report ranks the tanks and maps the flashes', async () => {
    const since = new Date()
    const statuses = await replayFeed({ url: inject('baseUrl'), token, csv: stormCsv(), batchSize: 10, intervalMs: 200 })
    expect(statuses.every(s => s === 202)).toBe(true)
    const mail = await waitForMail(pool, managerEmail, since, 60_000)
    expect(mail.subject).toContain('Storm alert')
    expect(mail.body).toContain('MB-1')
    const link = /\/storms\/[0-9a-f-]{36}/.exec(mail.body)![0]

    const { page, context, outsideRequests } = await openGuardedPage(browser)
    const [name, value] = managerCookie.split('=') as [string, string]
    await context.addCookies([{ name, value, url: inject('baseUrl') }])
    await page.goto(`${inject('baseUrl')}${link}`, { waitUntil: 'networkidle' })
    const rows = page.locator('[data-testid="storm-tanks"] tbody tr')
    await expect.poll(() => rows.count()).toBeGreaterThan(0)
    expect(await rows.first().innerText()).toContain('MB-1') // the tank nearest the strong flash ranks first
    const canvas = page.locator('[data-testid="storm-map"] canvas').first()
    await canvas.waitFor({ state: 'visible' })
    await page.waitForTimeout(800)
    const inked = await canvas.evaluate((c: HTMLCanvasElement) => {
      const { data } = c.getContext('2d')!.getImageData(0, 0, c.width, c.height)
      let n = 0
      for (let i = 3; i < data.length; i += 4) if (data[i]! > 0) n++
      return n
    })
    expect(inked).toBeGreaterThan(1000)
    // The organisation holds no terms on the site: "no terms", never a loss of 0, and the total says how many.
    const siteRow = page.locator('[data-testid="storm-sites"] tbody tr', { hasText: 'Mesa tank battery' })
    expect(await siteRow.locator('td[data-terms]').getAttribute('data-terms')).toBe('none')
    expect(await siteRow.locator('td[data-terms]').innerText()).toBe('no terms')
    const insuredTotal = await page.getByTestId('storm-insured-total').innerText()
    expect(insuredTotal).toContain('1 with no terms')
    expect(insuredTotal).not.toMatch(/USD 0\b/)
    expect(await page.getByTestId('caution-notice').count()).toBeGreaterThan(0)
    await saveScreenshot(page, 'storm-report')
    expect(outsideRequests).toEqual([])
  })

  it('an upload with bad lines is refused whole; the page lists each bad line from data.fields', async () => {
    const { page, context, outsideRequests } = await openGuardedPage(browser)
    const [name, value] = analystCookie.split('=') as [string, string]
    await context.addCookies([{ name, value, url: inject('baseUrl') }])
    await page.goto(`${inject('baseUrl')}/storms`, { waitUntil: 'networkidle' })
    const csv = 'time,latitude,longitude,peak_current_ka,type,location_error_km\n2026-06-21T10:00:00Z,32.2,-101.9,-20,ground,0.1\n2026-06-21T10:01:00Z,95.0,-101.9,-20,ground,0.1\n2026-06-21T10:02:00Z,32.2,-101.9,-20,lightning,0.1\n'
    await page.getByTestId('storm-upload').setInputFiles({ name: 'bad-storm.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) })
    const lines = page.getByTestId('storm-upload-lines').locator('li')
    await expect.poll(() => lines.count()).toBe(2)
    expect(await lines.nth(0).innerText()).toMatch(/^Line 3: .*latitude/)
    expect(await lines.nth(1).innerText()).toMatch(/^Line 4: /)
    expect(outsideRequests).toEqual([])
  })
})
