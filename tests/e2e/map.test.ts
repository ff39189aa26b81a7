// The portfolio map on the overview, as a reader uses it: fitted to the sites, nearby sites grouped,
// a scale bar, place names and borders from the shipped basemap, a hover read-out with units, and a
// click on a site opening its results.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchBrowser, openGuardedPage, saveScreenshot, type GuardedPage } from '../support/browser'
import { signInPage } from '../support/browser-session'
import { DEMO_PASSWORD, DEMO_UNDERWRITER, demoRun } from '../support/demo-run'
import { waitForDrawnChart } from '../support/charts'
import { ink } from '../../shared/theme'

let browser: Browser
let guarded: GuardedPage
let page: Page
let runId: string

beforeAll(async () => {
  browser = await launchBrowser()
  guarded = await openGuardedPage(browser)
  page = guarded.page
  await signInPage(page, inject('baseUrl'), DEMO_UNDERWRITER, DEMO_PASSWORD)
  runId = await demoRun(page)
}, 480_000)
afterAll(async () => { await browser?.close() })

/** The first pixel outlined in the theme's ink 900 (only single sites are, shared/theme.ts), in CSS px of the canvas. */
async function siteSymbolPixel(p: Page): Promise<{ x: number, y: number } | null> {
  const canvas = p.getByTestId('map-sites').locator('canvas').first()
  const rgb = [1, 3, 5].map(k => parseInt(ink[900].slice(k, k + 2), 16))
  const hit = await canvas.evaluate((c: HTMLCanvasElement, ref: number[]) => {
    const { data, width } = c.getContext('2d')!.getImageData(0, 0, c.width, c.height)
    const scale = c.width / c.getBoundingClientRect().width
    for (let i = 0; i < data.length; i += 4) {
      const [r, g, b, a] = [data[i]!, data[i + 1]!, data[i + 2]!, data[i + 3]!]
      if (a > 200 && Math.abs(r - ref[0]!) < 12 && Math.abs(g - ref[1]!) < 12 && Math.abs(b - ref[2]!) < 12) {
        const k = i / 4
        return { x: (k % width) / scale, y: Math.floor(k / width) / scale }
      }
    }
    return null
  }, rgb)
  if (!hit) return null
  const box = (await canvas.boundingBox())!
  // One pixel inside the outline, towards the symbol's centre below it.
  return { x: box.x + hit.x, y: box.y + hit.y + 2 }
}

describe('the sites map', () => {
  it('fits the sites, groups the nearby ones, shows a scale bar and a legend with values', async () => {
    await page.goto(`${inject('baseUrl')}/overview?run=${runId}`, { waitUntil: 'networkidle' })
    const map = page.getByTestId('map-sites')
    await map.scrollIntoViewIfNeeded()
    expect(await waitForDrawnChart(page, map, 5000, 30_000)).toBeGreaterThan(5000)
    const sites = await page.evaluate(async id => (await fetch(`/api/runs/${id}/sites`)).json(), runId) as { sites: unknown[] }
    const summary = page.getByTestId('map-summary')
    await page.waitForFunction(() => document.querySelector('[data-testid="map-scale"]') !== null, undefined, { timeout: 10_000 })
    const marks = Number(await summary.getAttribute('data-marks'))
    // Not one blob: more than a handful of marks; and fewer than the sites when some overlap at the fitted zoom.
    expect(marks).toBeGreaterThan(4)
    expect(marks).toBeLessThanOrEqual(sites.sites.length)
    // The legend's ends carry values with their unit (frequencies "/yr", methodology's house style).
    expect(await summary.textContent()).toMatch(/colour from .*\/yr.*\(lowest\) to .*\/yr.*\(highest\)/)
    expect(await page.getByTestId('map-scale').textContent()).toMatch(/^\s*[\d,]+ (km|m)\s*$/)
    await saveScreenshot(page, 'map-overview')
  })

  it('hovering a site shows its name, the metric with its unit and the insured value in the organisation\'s currency', async () => {
    const spot = await siteSymbolPixel(page)
    expect(spot).not.toBeNull()
    await page.mouse.move(spot!.x, spot!.y, { steps: 3 })
    const tip = page.getByTestId('map-sites').locator('div').filter({ hasText: 'Insured value:' }).last()
    await tip.waitFor({ state: 'visible', timeout: 5000 })
    const text = (await tip.textContent())!
    // The demo insurer's currency is USD (server/db/seed); the default map metric is expected fires per year.
    expect(text).toMatch(/\/yr/)
    expect(text).toMatch(/Insured value: USD [\d,]+/)
    const names = await page.locator('[data-testid="map-sites"] ul[aria-label="Sites on the map"] button').allTextContents()
    expect(names.some(n => text.startsWith(n.split(':')[0]!))).toBe(true)
  })

  it('clicking a site opens its results', async () => {
    const spot = await siteSymbolPixel(page)
    expect(spot).not.toBeNull()
    await page.mouse.click(spot!.x, spot!.y)
    await page.waitForURL(new RegExp(`/results/${runId}/sites/[0-9a-f-]+`), { timeout: 10_000 })
    expect(guarded.outsideRequests).toEqual([])
  })
})
