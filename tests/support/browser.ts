// Headless Debian Chromium through playwright-core. Every page fails its test on any request that
// leaves this machine (the product ships its fonts, basemap and scripts).
import { mkdirSync } from 'node:fs'
import { resolve } from 'node:path'
import { chromium, type Browser, type BrowserContext, type BrowserContextOptions, type Page } from 'playwright-core'

const LOCAL_HOSTS = new Set(['localhost', '127.0.0.1', '[::1]'])
export const screenshotDir = resolve(import.meta.dirname, '../../test-results/screenshots')

export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
      '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  })
}

export interface GuardedPage { page: Page, context: BrowserContext, outsideRequests: string[], consoleErrors: string[] }

/** `options` adds to the context (e.g. a `timezoneId` far from UTC, to catch dates rendered in local time). */
export async function openGuardedPage(browser: Browser, options: BrowserContextOptions = {}): Promise<GuardedPage> {
  const context = await browser.newContext({ viewport: { width: 1360, height: 900 }, ...options })
  const outsideRequests: string[] = []
  const consoleErrors: string[] = []
  await context.route('**/*', (route) => {
    const url = new URL(route.request().url())
    if (url.protocol === 'data:' || url.protocol === 'blob:' || LOCAL_HOSTS.has(url.hostname)) return route.continue()
    outsideRequests.push(url.href)
    return route.abort()
  })
  const page = await context.newPage()
  page.on('console', (m) => { if (m.type() === 'error') consoleErrors.push(m.text()) })
  return { page, context, outsideRequests, consoleErrors }
}

export async function saveScreenshot(page: Page, name: string): Promise<string> {
  mkdirSync(screenshotDir, { recursive: true })
  const path = resolve(screenshotDir, `${name}.png`)
  await page.screenshot({ path, fullPage: true })
  return path
}
