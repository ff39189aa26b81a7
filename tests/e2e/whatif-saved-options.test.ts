// In a real browser: a what-if option saved from a run's tank survives a reload (kept on the server),
// and "Send to capital plan" puts the candidate action in the plan in one click (issue "Screens a
// practitioner reads at a glance": saved options vanished on reload; add Send to capital plan).
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openGuardedPage, saveScreenshot } from '../support/browser'
import { signInPage } from '../support/browser-session'
import { DEMO_PASSWORD, demoRun } from '../support/demo-run'

// The demo insurer's asset manager (README "Demo sign-ins"): saves options and builds the capital plan.
const ASSET_MANAGER = 'asset.manager@cobaltridge.example'
let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

describe('what-if saved options', () => {
  it('survive a reload and go to the capital plan in one click', async () => {
    const base = inject('baseUrl')
    const { page, context, outsideRequests, consoleErrors } = await openGuardedPage(browser)
    await signInPage(page, base, ASSET_MANAGER, DEMO_PASSWORD)
    const runId = await demoRun(page)
    const { siteId, tankId, tag } = await page.evaluate(async (run) => {
      const { sites } = await (await fetch(`/api/runs/${run}/sites`)).json() as { sites: { siteId: string }[] }
      const site = await (await fetch(`/api/runs/${run}/sites/${sites[0]!.siteId}`)).json() as { tanks: { tankId: string, tag: string }[] }
      return { siteId: sites[0]!.siteId, tankId: site.tanks[0]!.tankId, tag: site.tanks[0]!.tag }
    }, runId)

    await page.goto(`${base}/what-if?run=${runId}&site=${siteId}&tank=${tankId}&shield=60`, { waitUntil: 'networkidle' })
    await page.locator('[data-figure="sparking"] [data-role="value"]').waitFor()
    const label = `Shield 60 kA on ${tag} (browser test)`
    await page.getByTestId('option-label').fill(label)
    await page.getByTestId('save-option').click()
    const saved = page.locator('[data-role="saved-option"]', { hasText: label })
    await saved.waitFor()

    await page.reload({ waitUntil: 'networkidle' })
    await saved.waitFor()
    expect(await saved.count()).toBe(1)
    expect(await saved.innerText()).toContain(`Tank ${tag}`)

    // The catalogue's shield is offered for a what-if shield (shared/capital/whatif-send.ts).
    const choice = await saved.locator('[data-role="send-option"]').inputValue()
    expect(choice).not.toBe('')
    await saved.locator('[data-role="send-to-plan"]').click()
    await saved.locator('[data-role="sent"]').waitFor()
    await saveScreenshot(page, 'what-if-saved-options')
    const actionId = await page.evaluate(async ({ run, site, label }) => {
      const list = await (await fetch(`/api/whatif-options?runId=${run}&siteId=${site}`)).json() as { label: string, sentAction: { id: string } | null }[]
      return list.find(o => o.label === label)?.sentAction?.id ?? null
    }, { run: runId, site: siteId, label })
    expect(actionId).toBeTruthy()

    await page.goto(`${base}/capital-plan`, { waitUntil: 'networkidle' })
    const row = page.locator(`[data-testid="action-row"][data-action-id="${actionId}"]`)
    await row.waitFor()
    expect(await row.innerText()).toContain(tag)

    // Leave the demo's capital plan and options as they were for the other browser tests.
    await page.evaluate(async ({ action, run, site }) => {
      await fetch(`/api/capital/actions/${action}`, { method: 'DELETE' })
      const list = await (await fetch(`/api/whatif-options?runId=${run}&siteId=${site}`)).json() as { id: string }[]
      for (const o of list) await fetch(`/api/whatif-options/${o.id}`, { method: 'DELETE' })
    }, { action: actionId, run: runId, site: siteId })
    expect(outsideRequests).toEqual([])
    expect(consoleErrors).toEqual([])
    await context.close()
  })
})
