import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openGuardedPage, saveScreenshot } from '../support/browser'
import { primary } from '../../shared/theme'

let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

describe('front page in a real browser', () => {
  it('renders with Lato, the theme and a drawn chart, and asks nothing of the internet', async () => {
    const { page, context, outsideRequests } = await openGuardedPage(browser)
    await page.goto(`${inject('baseUrl')}/`, { waitUntil: 'networkidle' })

    await page.evaluate(() => document.fonts.ready)
    expect(await page.evaluate(() => document.fonts.check('16px Lato'))).toBe(true)
    const family = await page.evaluate(() => getComputedStyle(document.body).fontFamily)
    expect(family).toContain('Lato')

    // The primary button takes the theme's primary 700 (shared/theme.ts), proving Tailwind's theme is ours.
    const buttonColour = await page.locator('a.btn-primary').first().evaluate(el => getComputedStyle(el).backgroundColor)
    const hex = primary[700].slice(1)
    const rgb = `rgb(${parseInt(hex.slice(0, 2), 16)}, ${parseInt(hex.slice(2, 4), 16)}, ${parseInt(hex.slice(4, 6), 16)})`
    expect(buttonColour).toBe(rgb)

    // ECharts draws onto a canvas; a drawn chart has non-blank pixels.
    const canvas = page.locator('[data-testid="front-chart"] canvas').first()
    await canvas.waitFor({ state: 'visible' })
    const inked = await canvas.evaluate((c: HTMLCanvasElement) => {
      const ctx = c.getContext('2d')!
      const { data } = ctx.getImageData(0, 0, c.width, c.height)
      let n = 0
      for (let i = 3; i < data.length; i += 4) if (data[i]! > 0) n++
      return n
    })
    expect(inked).toBeGreaterThan(1000)

    await saveScreenshot(page, 'front-page')
    expect(await page.getByTestId('caution-notice').count()).toBe(1)
    expect(await page.getByTestId('caution-notice').isVisible()).toBe(true)
    expect(outsideRequests).toEqual([])
    await context.close()
  })
})
