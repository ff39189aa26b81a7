// Storms that hit several sites (issue 21) in a real browser: an analyst calibrates storm clustering
// from an uploaded records file and saves it as an assumption version; a viewer opens the
// accumulation view of a run in which two sites lose together, and of a run without simulated years.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { defaultAssumptions } from '../../shared/engine/assumptions'
import { createOrganisation, memberClient } from '../support/accounts'
import { waitForDrawnChart } from '../support/charts'
import { launchBrowser, openGuardedPage, saveScreenshot } from '../support/browser'
import { testPool } from '../support/db'
import { createDefaultAssumptions, createFleet } from '../support/fleet'
import { insertHandMadeRun } from '../support/insurance'
import { thomasRecordsCsv } from '../support/thomas-records'

const pool = testPool()
let browser: Browser
let analystCookie: string
let viewerCookie: string
let runId: string
let frequencyRunId: string

beforeAll(async () => {
  browser = await launchBrowser()
  const org = await createOrganisation(pool, 'Storm Clustering Browser Operator')
  analystCookie = (await memberClient(pool, org, 'analyst')).cookie
  viewerCookie = (await memberClient(pool, org, 'viewer')).cookie
  const portfolioId = await createFleet(pool, org, { sites: 3, tanksPerSite: 1, seed: 'accumulation-e2e', name: 'Coastal fleet' })
  const versionId = await createDefaultAssumptions(pool, org, defaultAssumptions)
  const set = await pool.query(`INSERT INTO assumption_sets (organisation_id, name) VALUES ($1, 'Clustering set') RETURNING id`, [org])
  await pool.query(`INSERT INTO assumption_set_versions (assumption_set_id, version, parameters, provenance) VALUES ($1, 1, $2, '{}')`, [set.rows[0].id, JSON.stringify(defaultAssumptions)])
  const sites = (await pool.query(`SELECT site_id FROM portfolio_sites WHERE portfolio_id = $1 ORDER BY site_id`, [portfolioId])).rows.map(r => r.site_id as string)
  // 1,000 years: the first two sites lose together in years 0–19, the third alone in years 500–519.
  const ab = Array.from({ length: 20 }, (_, y) => y)
  runId = await insertHandMadeRun(pool, {
    organisationId: org, portfolioId, assumptionVersionId: versionId, years: 1000,
    siteEvents: { [sites[0]!]: ab.map(y => [y, 400_000]), [sites[1]!]: ab.map(y => [y, 250_000]), [sites[2]!]: ab.map(y => [500 + y, 10_000]) },
    names: { [sites[0]!]: 'Harbour tank farm', [sites[1]!]: 'Quay terminal', [sites[2]!]: 'Inland depot' },
  })
  // Place the sites (the hand-made run's facts carry no position): two 20 km apart, one inland.
  const places: [number, number, number][] = [[29.70, -95.20, 5e6], [29.78, -95.02, 3e6], [30.40, -96.10, 2e6]]
  for (const [i, [lat, lon, value]] of places.entries()) {
    await pool.query(`UPDATE run_site_snapshots SET facts = facts || jsonb_build_object('latitudeDeg', $3::float8, 'longitudeDeg', $4::float8, 'insuredValue', $5::float8) WHERE run_id = $1 AND site_id = $2`, [runId, sites[i], lat, lon, value])
  }
  frequencyRunId = await insertHandMadeRun(pool, { organisationId: org, portfolioId, assumptionVersionId: versionId, years: 10, siteEvents: { [sites[0]!]: [] } })
  await pool.query(`UPDATE runs SET mode = 'frequency' WHERE id = $1`, [frequencyRunId])
})
afterAll(async () => { await browser?.close(); await pool.end() })

async function signedInPage(cookie: string) {
  const guarded = await openGuardedPage(browser)
  const [name, value] = cookie.split('=') as [string, string]
  await guarded.context.addCookies([{ name, value, url: inject('baseUrl') }])
  return guarded
}

describe('storm clustering and accumulation in a real browser', () => {
  it('calibrates storm clustering from an uploaded file and saves it as an assumption version', async () => {
    const { page, context, outsideRequests } = await signedInPage(analystCookie)
    await page.goto(`${inject('baseUrl')}/calibration/storm-clustering`, { waitUntil: 'networkidle', timeout: 90_000 })
    // Truth: σ = 8 km, 150 flashes per storm, 4 storms a day over ≈ 300 × 300 km, 40 days (tests/support/thomas-records.ts).
    const csv = thomasRecordsCsv({ box: { minLat: 30, maxLat: 32.7, minLon: -97, maxLon: -93.9 }, days: 40, stormsPerDay: 4, flashesPerStorm: 150, spreadKm: 8, seed: 31 })
    await page.getByTestId('lightning-upload').setInputFiles({ name: 'synthetic-storms.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) })
    await expect.poll(() => page.getByTestId('lightning-file').innerText(), { timeout: 30_000 }).toContain('synthetic-storms.csv')
    await page.getByTestId('clustering-title').fill('Synthetic storms, 40 days')
    await page.locator('input[name="detectionEfficiency"]').fill('1')
    await page.locator('select[name="recordsAre"]').selectOption('flashes')
    await page.locator('input[name="bootstrap"]').fill('19')
    await saveScreenshot(page, 'calibration-storm-clustering-form')
    await page.getByTestId('clustering-submit').click()
    await page.waitForURL(/\/calibration\/[0-9a-f-]{36}$/, { timeout: 60_000 })
    const fit = await page.getByTestId('storm-clustering-fit').innerText()
    expect(fit).toMatch(/Storm spread σ/)
    expect(fit).toMatch(/km \(/) // the estimate with its interval
    const sigma = Number(/Storm spread σ[^\n]*?\t([\d.]+) km/.exec(fit)?.[1])
    // Within 15 % of the simulated σ = 8 km (the stated tolerance of the unit and server tests).
    expect(sigma).toBeGreaterThan(6.8)
    expect(sigma).toBeLessThan(9.2)
    expect(await waitForDrawnChart(page, page.getByTestId('storm-clustering-chart'), 1001)).toBeGreaterThan(1000)
    await page.getByTestId('save-set').selectOption({ label: 'Clustering set' })
    await page.getByTestId('save-version').click()
    await expect.poll(() => page.getByTestId('save-confirmation').innerText()).toContain('“Clustering set”')
    await page.waitForTimeout(800)
    await saveScreenshot(page, 'calibration-storm-clustering-result')
    expect(outsideRequests).toEqual([])
    await context.close()
  })

  it('shows which sites lose together, on the map and as a list', async () => {
    const { page, context, outsideRequests } = await signedInPage(viewerCookie)
    await page.goto(`${inject('baseUrl')}/runs/${runId}/accumulation`, { waitUntil: 'networkidle', timeout: 90_000 })
    const groups = await page.getByTestId('accumulation-groups').innerText()
    // Hand-worked: 10 worst years of 650,000 each; the pair holds all of it (100 %), all 10 together.
    expect(groups).toContain('Harbour tank farm')
    expect(groups).toContain('Quay terminal')
    expect(groups).not.toContain('Inland depot')
    expect(groups).toContain('100 %')
    expect(groups).toMatch(/10 of 10/)
    expect(groups).toMatch(/6,500,000/)
    const sites = await page.getByTestId('accumulation-sites').innerText()
    expect(sites).not.toContain('Inland depot') // no loss in the worst years: not listed
    expect(await waitForDrawnChart(page, page.getByTestId('map-sites'), 1001)).toBeGreaterThan(1000)
    await page.waitForTimeout(800)
    await saveScreenshot(page, 'accumulation-view')
    await page.goto(`${inject('baseUrl')}/runs/${frequencyRunId}/accumulation`, { waitUntil: 'networkidle', timeout: 90_000 })
    expect(await page.getByTestId('accumulation-empty').innerText()).toMatch(/no simulated years/)
    expect(outsideRequests).toEqual([])
    await context.close()
  })
})
