// In a real browser: the forms moved onto the one form contract (useSchemaForm, issue "One way to do
// each thing") show each message beside its own field — starting a run, creating an assumption set,
// an impulse calibration. Messages are the shared schemas' own (shared/schemas/).
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, Locator, Page } from 'playwright-core'
import { launchBrowser, openGuardedPage, type GuardedPage } from '../support/browser'
import { signInPage } from '../support/browser-session'
import { DEMO_PASSWORD } from '../support/demo-run'

// The demo operator's analyst (README "Demo sign-ins").
const ANALYST = 'analyst@dunmere.example'
let browser: Browser
let g: GuardedPage
beforeAll(async () => {
  browser = await launchBrowser()
  g = await openGuardedPage(browser)
  await signInPage(g.page, inject('baseUrl'), ANALYST, DEMO_PASSWORD)
})
afterAll(async () => { await g?.context.close(); await browser?.close() })

/** The message shown inside the same label as the control. */
const messageBeside = (control: Locator) => control.locator('xpath=ancestor::label[1]').locator('.field-error')

async function noRequestTo(page: Page, path: string, act: () => Promise<void>) {
  const sent: string[] = []
  const listen = (r: { url: () => string, method: () => string }) => { if (r.method() === 'POST' && new URL(r.url()).pathname === path) sent.push(r.url()) }
  page.on('request', listen)
  await act()
  await page.waitForTimeout(300)
  page.off('request', listen)
  expect(sent).toEqual([])
}

describe('forms on the one contract', () => {
  it('start a run: a seed that is not whole is refused beside the seed, before any request', async () => {
    const { page } = g
    await page.goto(`${inject('baseUrl')}/runs`, { waitUntil: 'networkidle' })
    const seed = page.locator('input[name="seed"]')
    await seed.fill('1.5')
    await noRequestTo(page, '/api/runs', () => page.getByRole('button', { name: 'Start run' }).click())
    expect(await messageBeside(seed).innerText()).toBe('The seed is a whole number.')
    // Editing the field clears its message.
    await seed.fill('42')
    await expect.poll(() => messageBeside(seed).count()).toBe(0)
  })

  it('new assumption set: an empty name is refused beside the name', async () => {
    const { page } = g
    await page.goto(`${inject('baseUrl')}/assumptions`, { waitUntil: 'networkidle' })
    const name = page.locator('input[name="name"]')
    await noRequestTo(page, '/api/assumption-sets', () => page.getByRole('button', { name: 'Create' }).click())
    expect(await messageBeside(name).innerText()).toBe('Give the set a name.')
    expect(await name.getAttribute('aria-invalid')).toBe('true')
  })

  it('impulse calibration: each missing field says so beside itself, the empty series beside the series', async () => {
    const { page } = g
    await page.goto(`${inject('baseUrl')}/calibration/impulse`, { waitUntil: 'networkidle' })
    await noRequestTo(page, '/api/calibrations/impulse', () => page.getByTestId('impulse-save').click())
    expect(await messageBeside(page.getByTestId('impulse-title')).innerText()).toBe('Give the calibration a title.')
    expect(await messageBeside(page.getByTestId('impulse-configuration')).innerText()).toBe('Describe the test configuration (object, gap, waveshape, polarity).')
    await page.getByText('The series is empty: enter the applied levels and whether each one sparked.').waitFor()
    expect(g.outsideRequests).toEqual([])
    expect(g.consoleErrors).toEqual([])
  })
})
