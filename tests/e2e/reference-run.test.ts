// In a real browser: an analyst makes a run the portfolio's reference run on Runs, and the overview
// opens it — not the run that finished last (issue "Screens a practitioner reads at a glance").
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openGuardedPage, saveScreenshot } from '../support/browser'
import { signInPage } from '../support/browser-session'
import { testPool } from '../support/db'
import { DEMO_PASSWORD, demoRun } from '../support/demo-run'

// The demo insurer's analyst (README "Demo sign-ins").
const ANALYST = 'analyst@cobaltridge.example'
const pool = testPool()
let browser: Browser
let newerRunId: string | null = null
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => {
  if (newerRunId) await pool.query(`DELETE FROM runs WHERE id = $1`, [newerRunId])
  await pool.end()
  await browser?.close()
})

describe('reference run', () => {
  it('marked on Runs, it is the run the overview opens', async () => {
    const base = inject('baseUrl')
    const { page, context, outsideRequests, consoleErrors } = await openGuardedPage(browser)
    await signInPage(page, base, ANALYST, DEMO_PASSWORD)
    const runId = await demoRun(page)
    const { rows: [demo] } = await pool.query(`SELECT organisation_id, portfolio_id, portfolio_name, assumption_version_id, name FROM runs WHERE id = $1`, [runId])
    await pool.query(`UPDATE runs SET is_reference = false WHERE organisation_id = $1 AND portfolio_id = $2`, [demo.organisation_id, demo.portfolio_id])
    // A run of the same portfolio that finished later (created earlier, so the demo helpers still find the demo run first).
    const { rows: [newer] } = await pool.query(
      `INSERT INTO runs (organisation_id, portfolio_id, portfolio_name, name, assumption_version_id, mode, seed, target_rse, max_samples_per_tank, years,
        chunk_size, sites_total, tanks_total, chunks_total, input_hash, engine_version, state, created_at, finished_at)
       VALUES ($1, $2, $3, 'Finished later, not the reference', $4, 'frequency', 1, 0.2, 4000, 1000, 1, 1, 1, 1, 'x', 'test', 'succeeded', '2020-01-01T00:00:00Z', now() + interval '1 day')
       RETURNING id`, [demo.organisation_id, demo.portfolio_id, demo.portfolio_name, demo.assumption_version_id])
    newerRunId = newer.id

    // No reference yet: the overview opens the portfolio's newest finished run and says none is marked.
    await page.goto(`${base}/overview?portfolio=${demo.portfolio_id}`, { waitUntil: 'networkidle' })
    expect(await page.getByTestId('run-selector').inputValue()).toBe(newerRunId)
    expect(await page.getByTestId('overview-run').innerText()).toContain('none is marked yet')
    consoleErrors.length = 0 // that run has no stored figures, so its dashboard fails to load; not this test's point

    await page.goto(`${base}/runs`, { waitUntil: 'networkidle' })
    const row = page.locator('[data-testid="run-row"]', { has: page.locator(`a[href="/runs/${runId}"]`) })
    await row.locator('[data-role="mark-reference"]').click()
    await row.getByTestId('reference-badge').waitFor()
    expect(await page.locator('[data-testid="run-row"] [data-testid="reference-badge"]').count()).toBeGreaterThanOrEqual(1)
    await saveScreenshot(page, 'runs-reference')

    await page.goto(`${base}/overview`, { waitUntil: 'networkidle' })
    expect(await page.getByTestId('run-selector').inputValue()).toBe(runId)
    expect(await page.getByTestId('overview-portfolio').inputValue()).toBe(demo.portfolio_id)
    expect(await page.getByTestId('overview-run').innerText()).toContain(demo.name)
    await page.getByTestId('overview-reference').waitFor()
    await saveScreenshot(page, 'overview-reference-run')
    const { rows: audit } = await pool.query(`SELECT after FROM audit_events WHERE entity = 'run' AND entity_id = $1 AND action = 'update' ORDER BY at DESC LIMIT 1`, [runId])
    expect(audit[0]?.after?.referenceRun).toContain(runId)
    expect(outsideRequests).toEqual([])
    expect(consoleErrors).toEqual([])
    await context.close()
  })

  it('an analyst renames a run on its page; an empty name is refused beside the field', async () => {
    const base = inject('baseUrl')
    const { page, context, consoleErrors } = await openGuardedPage(browser)
    await signInPage(page, base, ANALYST, DEMO_PASSWORD)
    const runId = await demoRun(page)
    await page.goto(`${base}/runs/${runId}`, { waitUntil: 'networkidle' })
    const before = await page.getByTestId('run-name').innerText()
    await page.getByTestId('run-rename').click()
    await page.getByTestId('run-name-input').fill('   ')
    await page.getByTestId('run-name-save').click()
    // The message of shared/schemas/runs.ts (renameRunSchema), from the server's data.fields.
    await page.locator('#run-name-error').getByText('Name the run.').waitFor()
    await page.getByTestId('run-name-input').fill('Renewal basis, browser test')
    await page.getByTestId('run-name-save').click()
    await expect.poll(() => page.getByTestId('run-name').innerText()).toBe('Renewal basis, browser test')
    // Back to the demo's name for the other browser tests.
    await page.evaluate(async ([id, name]) => { await fetch(`/api/runs/${id}`, { method: 'PATCH', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ name }) }) }, [runId, before] as const)
    consoleErrors.splice(0, consoleErrors.length, ...consoleErrors.filter(e => !e.includes('400')))
    expect(consoleErrors).toEqual([])
    await context.close()
  })
})
