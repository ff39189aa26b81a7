// The Content Security Policy in a real browser: the app's pages render, the charts and the map draw,
// and the browser reports no CSP violation (securitypolicyviolation events and console errors). Also
// the pages this issue adds: My mail and the sessions on the profile.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openGuardedPage, saveScreenshot, type GuardedPage } from '../support/browser'
import { signInPage } from '../support/browser-session'
import { waitForDrawnChart } from '../support/charts'
import { DEMO_PASSWORD } from '../../server/db/seed/accounts'

// The demo scenario's broker admin (README "Demo sign-ins"); no other browser test signs in as it,
// so signing it out everywhere disturbs none.
const ADMIN = 'admin@quillfeather.example'

let browser: Browser
let g: GuardedPage
const violations: string[] = []

beforeAll(async () => {
  browser = await launchBrowser()
  g = await openGuardedPage(browser)
  await g.page.exposeFunction('reportCspViolation', (text: string) => { violations.push(text) })
  await g.page.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) => {
      void (window as unknown as { reportCspViolation: (t: string) => void }).reportCspViolation(`${e.violatedDirective} ${e.blockedURI} ${e.sourceFile}:${e.lineNumber}`)
    })
  })
})
afterAll(async () => { await g?.context.close(); await browser?.close() })

const cspErrors = () => g.consoleErrors.filter(e => /Content Security Policy|Refused to/i.test(e))

describe('pages under the Content Security Policy', () => {
  it('draws every chart and the map of the gallery with no violation', async () => {
    const res = await g.page.goto(`${inject('baseUrl')}/preview/results`, { waitUntil: 'networkidle' })
    expect(res?.headers()['content-security-policy']).toContain("frame-ancestors 'none'")
    for (const id of ['exceedance-chart', 'tank-heatmap', 'event-bands-heatmap', 'site-metric-heatmap', 'map-sites']) {
      expect(await waitForDrawnChart(g.page, g.page.getByTestId(id).first(), 2000, 30_000), id).toBeGreaterThan(2000)
    }
    await saveScreenshot(g.page, 'csp-gallery')
    expect(violations).toEqual([])
    expect(cspErrors()).toEqual([])
  })

  it('renders the public and signed-in pages, forms and the what-if with no violation', async () => {
    const base = inject('baseUrl')
    await g.page.goto(`${base}/sign-in`, { waitUntil: 'networkidle' })
    await g.page.getByLabel('E-mail').waitFor()
    await g.page.goto(`${base}/what-if`, { waitUntil: 'networkidle' })
    await g.page.goto(`${base}/methodology`, { waitUntil: 'networkidle' })
    await signInPage(g.page, base, ADMIN, DEMO_PASSWORD)
    for (const path of ['/overview', '/portfolios', '/sites', '/runs', '/assumptions', '/insurance', '/capital-plan', '/calibration', '/calibration/storm-clustering', '/storms', '/admin/members', '/admin/mailbox', '/admin/audit']) {
      const res = await g.page.goto(`${base}${path}`, { waitUntil: 'networkidle' })
      expect(res?.status(), path).toBe(200)
      await g.page.locator('h1').first().waitFor()
    }
    expect(violations).toEqual([])
    expect(cspErrors()).toEqual([])
    expect(g.outsideRequests).toEqual([])
  })

  it('shows My mail and the profile\'s sessions, and signs out everywhere', async () => {
    const base = inject('baseUrl')
    await g.page.goto(`${base}/my-mail`, { waitUntil: 'networkidle' })
    await g.page.getByRole('heading', { name: 'My mail' }).waitFor()
    expect(await g.page.getByText(`Messages to ${ADMIN}`).count()).toBe(1)
    await saveScreenshot(g.page, 'my-mail')

    await g.page.goto(`${base}/profile`, { waitUntil: 'networkidle' })
    const rows = g.page.getByTestId('session-row')
    await rows.first().waitFor()
    expect(await g.page.getByText('(this session)').count()).toBe(1)
    await saveScreenshot(g.page, 'profile-sessions')
    await g.page.getByTestId('sign-out-everywhere').click()
    await g.page.waitForURL(/\/sign-in/)
    const status = await g.page.evaluate(async () => (await fetch('/api/_auth/session')).status)
    expect(status).toBe(401)
    expect(violations).toEqual([])
    expect(cspErrors()).toEqual([])
  })
})

describe('the violation check itself', () => {
  it('sees a violation when a page runs an inline script without the nonce (so the checks above can fail)', async () => {
    await g.page.goto(`${inject('baseUrl')}/sign-in`, { waitUntil: 'networkidle' })
    const before = violations.length
    await g.page.evaluate(() => {
      const s = document.createElement('script')
      s.textContent = 'window.__injected = true'
      document.head.appendChild(s)
    })
    await expect.poll(() => violations.length).toBeGreaterThan(before)
    expect(await g.page.evaluate(() => (window as unknown as { __injected?: boolean }).__injected)).toBeUndefined()
  })
})
