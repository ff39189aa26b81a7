// The chart gallery (/preview/results) draws every result component from sample figures.
import { readFile } from 'node:fs/promises'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openGuardedPage, saveScreenshot, type GuardedPage } from '../support/browser'
import { hoverReadout, waitForDrawnChart } from '../support/charts'
import { sampleResults } from '../../shared/results/sample'

let browser: Browser
let g: GuardedPage
const jsBodies = new Map<string, string>()
const fetched: string[] = []

beforeAll(async () => {
  browser = await launchBrowser()
  g = await openGuardedPage(browser)
  g.page.on('response', async (r) => {
    fetched.push(r.url())
    if (r.url().endsWith('.js')) jsBodies.set(r.url(), await r.text().catch(() => ''))
  })
  await g.page.goto(`${inject('baseUrl')}/preview/results`, { waitUntil: 'networkidle' })
})
afterAll(async () => { await g?.context.close(); await browser?.close() })

describe('chart gallery with sample figures', () => {
  it('says plainly that the figures are samples and shows the caution', async () => {
    const { page } = g
    expect(await page.getByRole('heading', { level: 1 }).textContent()).toBe('Chart gallery (sample figures)')
    expect(await page.getByTestId('sample-banner').textContent()).toContain('SAMPLE FIGURES')
    expect(await page.getByTestId('caution-notice').isVisible()).toBe(true)
  })

  it('draws every chart on a canvas', async () => {
    const { page } = g
    for (const id of ['exceedance-chart', 'tank-heatmap', 'event-bands-heatmap', 'site-metric-heatmap', 'map-sites']) {
      const containers = page.getByTestId(id)
      const n = await containers.count()
      expect(n, id).toBeGreaterThan(0)
      for (let k = 0; k < n; k++) expect(await waitForDrawnChart(page, containers.nth(k)), `${id} #${k}`).toBeGreaterThan(2000)
    }
    // Two exceedance charts: the portfolio and the site comparison.
    expect(await page.getByTestId('exceedance-chart').count()).toBe(2)
  })

  it('shows seven headline tiles with units, return periods and intervals', async () => {
    const tiles = g.page.locator('[data-testid="headline-tiles"] [data-tile]')
    expect(await tiles.count()).toBe(7)
    const fires = await g.page.locator('[data-tile="ignition"]').textContent()
    // House style (STYLE.md §8): frequencies carry "/yr" and "once in N years"; intervals are given.
    expect(fires).toContain('/yr')
    expect(fires).toMatch(/once in [\d,]+ years/)
    expect(fires).toContain('95 % interval')
    expect(await g.page.locator('[data-tile="aal"] [data-role="value"]').textContent()).toMatch(/^USD [\d,]+$/)
  })

  it('never shows a collapsed interval (issue 15: no "14–14")', async () => {
    const texts = await g.page.locator('[data-testid="headline-tiles"] [data-tile]').allTextContents()
    const ranges = texts.flatMap(t => [...t.matchAll(/95 % interval (?:[A-Z]{3} )?([^–\s]+(?: × 10\S+)?)–([^\s/]+(?: × 10\S+)?)/g)])
    expect(ranges.length).toBeGreaterThanOrEqual(5) // the sample's tiles with intervals (shared/results/sample.ts)
    for (const m of ranges) expect(m[1]).not.toBe(m[2]) // distinct ends (the printer's rule, shared/format.ts)
  })

  it('ranks the drivers with shares that fall down the list', async () => {
    const shares = await g.page.locator('[data-testid="drivers-list"] li span[aria-label^="share"]').allTextContents()
    expect(shares.length).toBe(10)
    const values = shares.map(s => Number.parseFloat(s))
    for (let k = 1; k < values.length; k++) expect(values[k]!).toBeLessThanOrEqual(values[k - 1]!)
  })

  it('sorts the sites × metrics heatmap by any metric, both ways', async () => {
    const { page } = g
    const order = () => page.locator('[data-testid="site-metric-heatmap"] [data-role="sorted-site"]').allTextContents()
    // The sample rows are the input; the expected order is a plain sort of their tank counts (largest first, ties by name).
    const rows = sampleResults().rows
    const byTanks = [...rows].sort((a, b) => (b.values.tanks! - a.values.tanks!) || a.siteName.localeCompare(b.siteName)).map(r => r.siteName)
    await page.getByTestId('heatmap-sort').first().selectOption('tanks')
    expect((await order()).map(s => s.trim())).toEqual(byTanks)
    await page.getByTestId('heatmap-direction').first().click()
    const ascending = [...rows].sort((a, b) => (a.values.tanks! - b.values.tanks!) || a.siteName.localeCompare(b.siteName)).map(r => r.siteName)
    expect((await order()).map(s => s.trim())).toEqual(ascending)
  })

  it('gives hover read-outs with units', async () => {
    const { page } = g
    const exceedance = page.getByTestId('exceedance-chart').first()
    await exceedance.scrollIntoViewIfNeeded()
    const text = await hoverReadout(page, exceedance, 0.6, 0.55)
    expect(text).toContain('Once in')
    expect(text).toContain('USD')
    const tank = page.getByTestId('tank-heatmap')
    await tank.scrollIntoViewIfNeeded()
    const tankText = await hoverReadout(page, tank, 0.55, 0.4)
    expect(tankText).toMatch(/kA/)
    expect(tankText).toMatch(/ m from the tank/)
    // The probability carries its unit; the sample's probabilities span decades, so the legend says log scale (shared/results/heatmap-scale.ts).
    expect(tankText).toMatch(/(sparking probability per flash [\d.,×⁻⁰-⁹ ]+ %|strikes the tank directly)/)
    expect(await page.getByTestId('tank-heatmap-scale').textContent()).toContain('log scale')
    expect(await page.getByTestId('event-bands-scale').textContent()).toMatch(/(log|linear) scale/)
  })

  it('offers each chart\'s data as CSV', async () => {
    const { page } = g
    const chart = page.getByTestId('exceedance-chart').first()
    const [download] = await Promise.all([page.waitForEvent('download'), chart.getByRole('button', { name: 'Download data (CSV)' }).click()])
    const csv = await readFile((await download.path())!, 'utf8')
    expect(csv.split('\r\n')[0]).toBe('curve,kind,return_period_years,loss_USD')
    expect(csv.split('\r\n').length).toBeGreaterThan(10)
  })

  it('loads the basemap from this server as a file of its own, and a site can be chosen from the map', async () => {
    const { page } = g
    // The basemap is the GeoJSON shipped in public/basemap, fetched from this server.
    const basemap = fetched.filter(u => new URL(u).pathname === '/basemap/context.json')
    expect(basemap.length).toBe(1)
    expect(new URL(basemap[0]!).hostname).toBe('localhost')
    // The entry script named in the page's HTML holds no map data (Natural Earth's country names).
    const html = await (await fetch(`${inject('baseUrl')}/`)).text()
    const entries = [...html.matchAll(/<script[^>]+type="module"[^>]+src="([^"]+)"/g)].map(m => m[1]!)
    expect(entries.length).toBeGreaterThan(0)
    for (const src of entries) {
      const body = await (await fetch(new URL(src, inject('baseUrl')))).text()
      expect(body).not.toContain('Madagascar')
    }
    expect([...jsBodies.values()].some(body => body.includes('Madagascar'))).toBe(false)
    // A click on a site's symbol emits its id. Symbols are the only things outlined in a near-black
    // neutral (the theme's ink 900, shared/theme.ts; the ramp's dark end is blue), so the first such
    // pixel lies on a symbol's edge.
    const map = page.getByTestId('map-sites')
    await map.scrollIntoViewIfNeeded()
    const canvas = map.locator('canvas').first()
    const hit = await canvas.evaluate((c: HTMLCanvasElement, rgb: number[]) => {
      const ctx = c.getContext('2d')!
      const { data, width } = ctx.getImageData(0, 0, c.width, c.height)
      const scale = c.width / c.getBoundingClientRect().width
      for (let i = 0; i < data.length; i += 4) {
        const [r, g, b, a] = [data[i]!, data[i + 1]!, data[i + 2]!, data[i + 3]!]
        if (a > 200 && r < rgb[0]! + 28 && g < rgb[1]! + 24 && b < rgb[2]! + 27 && b - r < 25) {
          const k = i / 4
          return { x: (k % width) / scale, y: Math.floor(k / width) / scale }
        }
      }
      return null
    }, [0x16, 0x1a, 0x21])
    expect(hit).not.toBeNull()
    const box = (await canvas.boundingBox())!
    await page.mouse.click(box.x + hit!.x, box.y + hit!.y + 1)
    await page.waitForFunction(() => document.querySelector('[data-testid="selected-site"]')?.textContent?.includes('/sites/sample-site-'), undefined, { timeout: 5000 })
    // The keyboard-reachable list of sites emits the id too.
    await page.locator('[data-testid="map-sites"] ul[aria-label="Sites on the map"] button').nth(1).evaluate((b: HTMLButtonElement) => b.click())
    expect(await page.getByTestId('selected-site').textContent()).toContain('/sites/sample-site-2)')
  })

  it('shows the loading, empty and error states', async () => {
    const { page } = g
    expect(await page.getByTestId('state-loading').getByRole('status').textContent()).toContain('Loading')
    expect(await page.getByTestId('state-empty').textContent()).toContain('No run has finished')
    expect(await page.getByTestId('state-error').getByRole('alert').textContent()).toContain('could not be loaded')
  })

  it('asks nothing of the internet and logs no errors', async () => {
    await saveScreenshot(g.page, 'results-gallery')
    expect(g.outsideRequests).toEqual([])
    expect(g.consoleErrors).toEqual([])
  })
})
