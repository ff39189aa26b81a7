// In a real browser: the uncertainty of the assumptions on a version's page (issue "How sure are we"):
// the illustrative ranges labelled as such with their 5–95 % range and unit, an analyst's own
// distribution with a field message beside the number in error, a correlation, and the version
// comparison showing what changed.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { resolve } from 'node:path'
import { launchBrowser, openGuardedPage, saveScreenshot, screenshotDir } from '../support/browser'
import { signInPage } from '../support/browser-session'
import { testPool } from '../support/db'
import { DEMO_PASSWORD } from '../support/demo-run'

// Demo sign-ins (README).
const ANALYST = 'analyst@dunmere.example'
const VIEWER = 'viewer@dunmere.example'
const pool = testPool()
let browser: Browser
const cleanup: Array<() => Promise<unknown>> = []
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => {
  for (const undo of cleanup.reverse()) await undo()
  await pool.end()
  await browser?.close()
})

describe('uncertainty of the assumptions', () => {
  it('shows the illustrative ranges, takes an analyst\'s own with messages beside the field, and compares versions', async () => {
    const base = inject('baseUrl')
    const { page, context, outsideRequests, consoleErrors } = await openGuardedPage(browser)
    await signInPage(page, base, ANALYST, DEMO_PASSWORD)
    const created = await page.evaluate(async () => (await (await fetch('/api/assumption-sets', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ name: `Uncertainty test set ${Date.now()}` }) })).json()) as { set: { id: string }, version: { id: string } })
    cleanup.push(() => pool.query(`DELETE FROM assumption_sets WHERE id = $1`, [created.set.id]))
    // Used by a run: the edit becomes version 2, so the two can be compared.
    await pool.query(`UPDATE assumption_set_versions SET used_by_run = true WHERE id = $1`, [created.version.id])
    await page.goto(`${base}/assumptions/versions/${created.version.id}`, { waitUntil: 'networkidle' })

    const panel = page.getByTestId('assumption-uncertainty')
    const u50 = panel.locator('[data-uncertain-path="thresholds.sharp_device.u50Kv"]')
    // Log-normal, median 70 kV, σ of ln 0.35: 5–95 % = 70·exp(∓1.645·0.35) = 39.4 to 124 kV (closed form).
    expect(await u50.innerText()).toMatch(/log-normal, median 70 kV, σ of ln\(value\) 0\.35\s+39\.4 to 124 kV\s+illustrative range — calibrate/)
    await saveScreenshot(page, 'assumption-uncertainty-view')
    await u50.screenshot({ path: resolve(screenshotDir, 'assumption-uncertainty-view-row.png') })

    await page.getByRole('button', { name: 'Edit values' }).click()
    // The vapour-control factor becomes a uniform range, first beyond its valid [0, 1].
    const vapour = panel.locator('[data-uncertain-path="vapourControlFactor"]')
    await vapour.getByRole('combobox', { name: 'Distribution of Vapour-control factor on ignition' }).selectOption('uniform')
    await vapour.getByRole('textbox', { name: 'Lower bound of Vapour-control factor on ignition' }).fill('0.1')
    await vapour.getByRole('textbox', { name: 'Upper bound of Vapour-control factor on ignition' }).fill('1.2')
    await vapour.getByRole('textbox', { name: 'Why this range: Vapour-control factor on ignition' }).fill('site survey of the vapour recovery units')
    expect(await vapour.getByTestId('uncertainty-basis').innerText()).toBe('analyst\'s judgement') // a changed distribution is the analyst's
    // A value with no uncertainty yet gets one, and a correlation with a threshold.
    await panel.getByRole('combobox', { name: 'Assumption to give an uncertainty' }).selectOption('strikingDistanceB')
    await page.getByTestId('uncertainty-add').click()
    const b = panel.locator('[data-uncertain-path="strikingDistanceB"]')
    await b.getByRole('textbox', { name: 'Standard deviation of Striking distance exponent b' }).fill('0.05')
    await panel.getByRole('button', { name: 'Add a correlation' }).click()
    const corr = panel.getByTestId('correlation-row')
    await corr.getByRole('combobox', { name: 'Correlation 1: first assumption' }).selectOption('thresholds.sharp_device.u50Kv')
    await corr.getByRole('combobox', { name: 'Correlation 1: second assumption' }).selectOption('thresholds.sharp_device.sigma')
    await corr.getByRole('textbox', { name: 'Correlation 1: ρ' }).fill('-0.3')
    // A value changed from its default loses its illustrative range, and the form says so before saving.
    await page.locator('input[name="ignitionGivenSpark.crude"]').fill('0.35')
    await panel.locator('[data-uncertain-path="ignitionGivenSpark.crude"]').getByTestId('uncertainty-dropping').waitFor()
    await page.getByTestId('assumption-save').click()

    const message = vapour.locator('[data-field-error$=".distribution.max"]')
    await message.waitFor()
    expect(await message.innerText()).toMatch(/upper bound of Vapour-control factor on ignition \(1\.2\) lies outside its valid range \[0, 1\]/)
    expect(await vapour.getByRole('textbox', { name: 'Upper bound of Vapour-control factor on ignition' }).getAttribute('aria-invalid')).toBe('true')
    expect(await page.getByTestId('assumption-errors').innerText()).toContain('Some values need attention')
    await saveScreenshot(page, 'assumption-uncertainty-error')
    await vapour.screenshot({ path: resolve(screenshotDir, 'assumption-uncertainty-error-row.png') })

    await vapour.getByRole('textbox', { name: 'Upper bound of Vapour-control factor on ignition' }).fill('0.6')
    await page.getByTestId('assumption-save').click()
    await page.waitForURL(url => !url.pathname.endsWith(created.version.id))
    expect(await page.getByTestId('assumption-saved').innerText()).toContain('Saved — became version 2')
    const saved = (await pool.query(`SELECT parameters FROM assumption_set_versions WHERE assumption_set_id = $1 AND version = 2`, [created.set.id])).rows[0].parameters
    const entry = (path: string) => saved.uncertainty.entries.find((e: { path: string }) => e.path === path)
    expect(entry('vapourControlFactor')).toEqual({ path: 'vapourControlFactor', distribution: { kind: 'uniform', min: 0.1, max: 0.6 }, basis: 'analyst', note: 'site survey of the vapour recovery units' })
    // The added value starts as a normal on its value 0.65 (truncated to its valid range by default).
    expect(entry('strikingDistanceB')).toEqual({ path: 'strikingDistanceB', distribution: { kind: 'normal', mean: 0.65, sd: 0.05 }, basis: 'analyst', note: '' })
    expect(entry('thresholds.sharp_device.u50Kv').basis).toBe('illustrative')
    // Untouched ranges keep their basis, whatever order the database keeps their keys in.
    expect(entry('thresholds.sharp_device.sigma').basis).toBe('illustrative')
    expect(saved.uncertainty.entries.filter((e: { basis: string }) => e.basis === 'analyst').map((e: { path: string }) => e.path).sort()).toEqual(['strikingDistanceB', 'vapourControlFactor'])
    expect(entry('ignitionGivenSpark.crude')).toBeUndefined()
    expect(saved.ignitionGivenSpark.crude).toBe(0.35)
    expect(saved.uncertainty.correlations).toEqual([{ a: 'thresholds.sharp_device.u50Kv', b: 'thresholds.sharp_device.sigma', rho: -0.3 }])
    expect(await page.getByTestId('assumption-uncertainty').locator('[data-uncertain-path="vapourControlFactor"]').innerText()).toMatch(/uniform, 0\.1 to 0\.6\s+0\.125 to 0\.575\s+analyst's judgement/) // 5–95 % of U(0.1, 0.6): 0.1 + 0.05·0.5, 0.1 + 0.95·0.5

    await page.goto(`${base}/assumptions/${created.set.id}`, { waitUntil: 'networkidle' })
    const compare = page.getByTestId('uncertainty-compare')
    expect(await compare.locator('[data-uncertain-path="vapourControlFactor"]').getAttribute('data-differs')).toBe('true')
    expect(await compare.locator('[data-uncertain-path="thresholds.sharp_device.u50Kv"]').getAttribute('data-differs')).toBe('false')
    expect(await compare.locator('[data-uncertain-path="strikingDistanceB"]').innerText()).toMatch(/no uncertainty\s+normal, mean 0\.65, standard deviation 0\.05, truncated to the valid range/)
    await page.getByLabel('Only differences').check()
    await saveScreenshot(page, 'assumption-uncertainty-compare')
    expect(outsideRequests).toEqual([])
    expect(consoleErrors).toEqual([])
    await context.close()

    // A viewer reads the ranges and has no editor.
    const viewer = await openGuardedPage(browser)
    await signInPage(viewer.page, base, VIEWER, DEMO_PASSWORD)
    await viewer.page.goto(`${base}/assumptions/versions/${created.version.id}`, { waitUntil: 'networkidle' })
    await viewer.page.getByTestId('assumption-uncertainty').locator('[data-uncertain-path="flashDensityFactor"]').waitFor()
    expect(await viewer.page.getByRole('button', { name: 'Edit values' }).count()).toBe(0)
    await viewer.context.close()
  })
})
