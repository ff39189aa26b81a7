// The overview, a site's results and the what-if on a phone (390 × 844) and a small laptop or
// tablet held sideways (1024 × 768): nothing scrolls sideways but wide charts inside their own cards,
// the rail folds into a menu button on the phone, the top bar's names do not overlap. Screenshots
// land in test-results/screenshots/; with STORMLEDGER_UPDATE_DOCS_SCREENSHOTS=1 in docs/screenshots/
// (the README shows them), so that an ordinary `npm test` leaves the tracked files alone.
import { mkdirSync } from 'node:fs'
import { resolve } from 'node:path'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchBrowser, openGuardedPage, type GuardedPage } from '../support/browser'
import { signInPage } from '../support/browser-session'
import { DEMO_PASSWORD, DEMO_UNDERWRITER, demoRun } from '../support/demo-run'

const docsShots = process.env.STORMLEDGER_UPDATE_DOCS_SCREENSHOTS === '1'
  ? resolve(import.meta.dirname, '../../docs/screenshots')
  : resolve(import.meta.dirname, '../../test-results/screenshots')
const sizes = [{ name: 'phone', width: 390, height: 844 }, { name: 'laptop', width: 1024, height: 768 }] as const

let browser: Browser
let runId: string
let siteId: string

beforeAll(async () => {
  browser = await launchBrowser()
  const g = await openGuardedPage(browser)
  await signInPage(g.page, inject('baseUrl'), DEMO_UNDERWRITER, DEMO_PASSWORD)
  runId = await demoRun(g.page)
  const sites = await g.page.evaluate(async id => (await fetch(`/api/runs/${id}/sites`)).json(), runId) as { sites: { siteId: string }[] }
  siteId = sites.sites[0]!.siteId
  await g.context.close()
  mkdirSync(docsShots, { recursive: true })
}, 480_000)
afterAll(async () => { await browser?.close() })

async function sideways(page: Page): Promise<{ scrollWidth: number, innerWidth: number, wide: string[] }> {
  return page.evaluate(() => ({
    scrollWidth: document.documentElement.scrollWidth,
    innerWidth: window.innerWidth,
    // Elements sticking out of the viewport on the right, for the failure message.
    wide: [...document.querySelectorAll('body *')].filter(e => e.getBoundingClientRect().right > window.innerWidth + 1 && !e.closest('.overflow-x-auto'))
      .slice(0, 5).map(e => `${e.tagName.toLowerCase()}.${(e.getAttribute('class') ?? '').split(' ').slice(0, 3).join('.')}`),
  }))
}

describe.each(sizes)('on a $name ($width × $height)', ({ name, width, height }) => {
  let g: GuardedPage
  beforeAll(async () => {
    g = await openGuardedPage(browser, { viewport: { width, height } })
    await signInPage(g.page, inject('baseUrl'), DEMO_UNDERWRITER, DEMO_PASSWORD)
  })
  afterAll(async () => { await g?.context.close() })

  const pages = [
    { key: 'overview', path: () => `/overview?run=${runId}`, ready: 'headline-tiles' },
    { key: 'site-results', path: () => `/results/${runId}/sites/${siteId}`, ready: 'site-plan' },
    { key: 'what-if', path: () => '/what-if', ready: 'tank-heatmap' },
  ]
  for (const p of pages) {
    it(`${p.key}: nothing scrolls sideways; screenshot`, async () => {
      const { page } = g
      await page.goto(`${inject('baseUrl')}${p.path()}`, { waitUntil: 'networkidle' })
      await page.getByTestId(p.ready).first().waitFor()
      await page.waitForTimeout(1200) // charts animate in
      const s = await sideways(page)
      expect(s.scrollWidth, `sticking out: ${s.wide.join(', ')}`).toBeLessThanOrEqual(s.innerWidth)
      // The top bar's organisation and person do not overlap.
      const org = (await page.getByTestId('organisation-switcher').boundingBox())!
      const menu = (await page.getByTestId('user-menu').boundingBox())!
      expect(org.x + org.width).toBeLessThanOrEqual(menu.x)
      await page.screenshot({ path: resolve(docsShots, `${p.key}-${width}x${height}.png`), fullPage: true })
      expect(g.outsideRequests).toEqual([])
    })
  }

  it(name === 'phone' ? 'the rail folds into a menu button that the keyboard opens and Escape closes' : 'the rail stays open beside the page', async () => {
    const { page } = g
    await page.goto(`${inject('baseUrl')}/overview?run=${runId}`, { waitUntil: 'networkidle' })
    const rail = page.getByRole('navigation', { name: 'Sections' })
    const button = page.getByRole('button', { name: 'Menu', exact: true })
    if (name !== 'phone') {
      expect(await rail.isVisible()).toBe(true)
      expect(await button.isVisible()).toBe(false)
      return
    }
    expect(await rail.isVisible()).toBe(false)
    expect(await button.getAttribute('aria-expanded')).toBe('false')
    await button.focus()
    await page.keyboard.press('Enter')
    await rail.waitFor({ state: 'visible' })
    expect(await button.getAttribute('aria-expanded')).toBe('true')
    // Focus moves into the menu; Escape closes it and gives focus back to the button.
    expect(await page.evaluate(() => document.activeElement?.closest('nav')?.getAttribute('aria-label'))).toBe('Sections')
    await page.keyboard.press('Escape')
    await rail.waitFor({ state: 'hidden' })
    expect(await page.evaluate(() => document.activeElement?.getAttribute('aria-label'))).toBe('Menu')
    // Choosing a section closes the menu.
    await button.click()
    await rail.getByRole('link', { name: 'Sites', exact: true }).click()
    await page.waitForURL(/\/sites$/)
    await rail.waitFor({ state: 'hidden' })
  })
})
