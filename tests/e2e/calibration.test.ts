// Both calibration tools in a real browser: an analyst uploads the example files, sees both
// methods and the fit plot, and the saved calibration keeps its source.
import { resolve } from 'node:path'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { createOrganisation, memberClient } from '../support/accounts'
import { waitForDrawnChart } from '../support/charts'
import { launchBrowser, openGuardedPage, saveScreenshot } from '../support/browser'
import { testPool } from '../support/db'

const pool = testPool()
let browser: Browser
let cookie: string

beforeAll(async () => {
  browser = await launchBrowser()
  const org = await createOrganisation(pool, 'Calibration Browser Operator')
  await pool.query(`INSERT INTO sites (organisation_id, external_id, name, latitude_deg, longitude_deg, thunderstorm_days_per_yr) VALUES ($1, 'CB-1', 'Bayou tank farm', 29.76, -95.37, 60)`, [org])
  cookie = (await memberClient(pool, org, 'analyst')).cookie
})
afterAll(async () => { await browser?.close(); await pool.end() })

async function signedInPage(options: Parameters<typeof openGuardedPage>[1] = {}): Promise<Awaited<ReturnType<typeof openGuardedPage>>> {
  const guarded = await openGuardedPage(browser, options)
  const [name, value] = cookie.split('=') as [string, string]
  await guarded.context.addCookies([{ name, value, url: inject('baseUrl') }])
  return guarded
}

const examples = resolve(import.meta.dirname, '../../docs/examples')

describe('calibration in a real browser', () => {
  it('impulse: the example series gives both methods side by side, a drawn fit, and a saved calibration', async () => {
    const { page, context, outsideRequests } = await signedInPage()
    await page.goto(`${inject('baseUrl')}/calibration/impulse`, { waitUntil: 'networkidle', timeout: 90_000 })
    await page.getByTestId('impulse-upload').setInputFiles(resolve(examples, 'impulse-series.csv'))
    // The example is the hand-worked series: up-and-down U50 = 92.8 kV (IEC 60060-1 mean of the valid levels).
    await expect.poll(() => page.getByTestId('up-and-down-result').innerText()).toContain('92.8 kV')
    expect(await page.getByTestId('likelihood-result').innerText()).toMatch(/log-normal σ \(dimensionless\)/)
    expect(await waitForDrawnChart(page, page.getByTestId('impulse-chart'), 1001)).toBeGreaterThan(1000)
    await page.getByTestId('impulse-title').fill('Float switch, example series')
    await page.getByTestId('impulse-configuration').fill('float 20 mm from wall, 1.2/50 µs, negative')
    await page.getByTestId('impulse-basis').fill('test waveshape taken as the induced one')
    await page.getByTestId('impulse-save').click()
    await page.waitForURL(/\/calibration\/[0-9a-f-]{36}$/)
    await expect.poll(() => page.getByTestId('source-link').innerText()).toBe('impulse-series.csv')
    expect(await waitForDrawnChart(page, page.getByTestId('impulse-chart'), 1001)).toBeGreaterThan(1000)
    await page.waitForTimeout(1000) // let the chart's entry animation finish before the screenshot
    await saveScreenshot(page, 'calibration-impulse')
    expect(outsideRequests).toEqual([])
    await context.close()
  })

  it('impulse: saving as a new version confirms once, keeps the form, and the version names the calibration as the source', async () => {
    // A zone twelve hours from UTC: a date written in the browser's local time would differ from the
    // server's and Vue would report a hydration mismatch (console error in production builds).
    const { page, context, outsideRequests, consoleErrors } = await signedInPage({ timezoneId: 'Pacific/Auckland' })
    const setName = `Impulse save set ${Date.now()}`
    const created = await page.request.post(`${inject('baseUrl')}/api/assumption-sets`, { data: { name: setName, description: '', parameters: {}, note: '' } })
    expect(created.status()).toBeLessThan(300)
    const list = await (await page.request.get(`${inject('baseUrl')}/api/calibrations`)).json() as Array<{ id: string, kind: string, title: string }>
    const calibration = list.find(c => c.kind === 'impulse' && c.title === 'Float switch, example series')!
    await page.goto(`${inject('baseUrl')}/calibration/${calibration.id}`, { waitUntil: 'networkidle', timeout: 90_000 })
    expect(consoleErrors.filter(e => /hydrat/i.test(e)).map(e => `calibration page: ${e}`)).toEqual([])
    await page.getByTestId('save-set').selectOption({ label: setName })
    const save = page.getByTestId('save-version')
    await save.click()
    await expect.poll(() => page.getByTestId('save-confirmation').innerText()).toContain(`version 2 of “${setName}”`)
    // The button cannot save the same thing twice; the choices stay as they were.
    await expect.poll(() => save.innerText()).toBe('Saved as version 2')
    expect(await save.isDisabled()).toBe(true)
    expect(await page.getByTestId('save-set').locator('option:checked').innerText()).toBe(setName)
    await saveScreenshot(page, 'calibration-saved-version')
    await page.getByTestId('save-confirmation').getByRole('link').click()
    await page.waitForURL(/\/assumptions\/versions\//)
    const sources = page.getByTestId('calibrated-source')
    await expect.poll(() => sources.count()).toBeGreaterThan(0)
    const text = await sources.first().innerText()
    expect(text).toContain('Float switch, example series')
    expect(text).toContain('impulse-series.csv')
    expect(text).toMatch(/UTC/)
    await saveScreenshot(page, 'calibration-version-sources')
    // Opened afresh (server-rendered, then hydrated in a zone far from UTC).
    await page.reload({ waitUntil: 'networkidle', timeout: 90_000 })
    await sources.first().waitFor()
    expect(consoleErrors.filter(e => /hydrat/i.test(e)).map(e => `version page: ${e}`)).toEqual([])
    expect(outsideRequests).toEqual([])
    await context.close()
  })

  it('lightning: uploading, refusing a bad file with its row errors, and Ng with the fit plot', async () => {
    const { page, context, outsideRequests } = await signedInPage()
    await page.goto(`${inject('baseUrl')}/calibration/lightning`, { waitUntil: 'networkidle', timeout: 90_000 })
    await page.getByTestId('lightning-upload').setInputFiles({ name: 'bad.csv', mimeType: 'text/csv', buffer: Buffer.from('time,latitude,longitude,peak_current_ka,type\n2022-06-03T14:35:59Z,95.2,-95.4,-33.1,ground\n') })
    // Latitude beyond 90° is impossible (WGS 84); the row is named by its line.
    await expect.poll(() => page.getByTestId('row-errors').innerText()).toContain('latitude "95.2" must be decimal degrees between −90 and 90')
    await page.getByTestId('lightning-upload').setInputFiles(resolve(examples, 'lightning-records.csv'))
    await expect.poll(() => page.getByTestId('lightning-file').innerText()).toContain('lightning-records.csv')
    await page.getByTestId('lightning-title').fill('Example records')
    await page.getByLabel('All sites').check()
    await page.getByTestId('lightning-radius').fill('20')
    await page.getByTestId('lightning-submit').click()
    await page.waitForURL(/\/calibration\/[0-9a-f-]{36}$/)
    expect(await page.getByTestId('site-density-table').innerText()).toContain('Bayou tank farm')
    // The example records span 29.63–29.89° N and 95.48–95.22° W (docs/examples/lightning-records.csv); the site (29.76° N, 95.37° W)
    // lies 0.11° of longitude (10.9 km) from the western edge, so a 20 km circle reaches about 9 km beyond them (hand-worked).
    expect(await page.getByTestId('calibration-warnings').innerText()).toMatch(/20 km circle around Bayou tank farm reaches [\d.]+ km beyond the area the records span/)
    expect(await waitForDrawnChart(page, page.getByTestId('current-fit-chart'), 1001)).toBeGreaterThan(1000)
    await saveScreenshot(page, 'calibration-lightning')
    expect(outsideRequests).toEqual([])
    await context.close()
  })
})
