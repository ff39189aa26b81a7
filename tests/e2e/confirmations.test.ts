// In a real browser: changing a member's role and cancelling a run ask first, in one accessible
// dialog; saving an assumption says which version it became, and a wrong value's message sits beside
// its field (issue "Screens a practitioner reads at a glance", "Forms").
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, openGuardedPage, saveScreenshot } from '../support/browser'
import { signInPage } from '../support/browser-session'
import { createMember } from '../support/accounts'
import { testPool } from '../support/db'
import { DEMO_PASSWORD } from '../support/demo-run'

// Demo sign-ins (README): an operator whose members no other browser test changes.
const ADMIN = 'admin@sablefork.example'
const ANALYST = 'analyst@sablefork.example'
const pool = testPool()
let browser: Browser
let orgId: string
const cleanup: Array<() => Promise<unknown>> = []
beforeAll(async () => {
  browser = await launchBrowser()
  orgId = (await pool.query(`SELECT id FROM organisations WHERE name = 'Sablefork Petroleum'`)).rows[0].id
})
afterAll(async () => {
  for (const undo of cleanup.reverse()) await undo()
  await pool.end()
  await browser?.close()
})

describe('confirmations and messages', () => {
  it('a role changes only after the dialog is confirmed; closing it keeps the role', async () => {
    const base = inject('baseUrl')
    const member = await createMember(pool, orgId, 'viewer')
    cleanup.push(() => pool.query(`DELETE FROM memberships WHERE id = $1`, [member.membershipId]))
    const { page, context, outsideRequests, consoleErrors } = await openGuardedPage(browser)
    await signInPage(page, base, ADMIN, DEMO_PASSWORD)
    await page.goto(`${base}/admin/members`, { waitUntil: 'networkidle' })
    const select = page.locator(`select[data-role-of="${member.email}"]`)
    const dialog = page.getByRole('dialog')

    await select.selectOption('analyst')
    await dialog.waitFor()
    expect(await dialog.getByRole('heading').innerText()).toBe('Make Test viewer analyst?')
    // The dialog is named by its title, and the safe choice has the focus.
    expect(await page.getByRole('dialog', { name: 'Make Test viewer analyst?' }).count()).toBe(1)
    expect(await page.evaluate(() => document.activeElement?.textContent?.trim())).toBe('Keep the role')
    await saveScreenshot(page, 'confirm-role-change')
    await page.keyboard.press('Escape')
    await dialog.waitFor({ state: 'hidden' })
    // The browser closes the dialog on Escape at once; the page then puts the picker back.
    await expect.poll(() => select.inputValue()).toBe('viewer')
    const roleNow = async () => (await pool.query(`SELECT role FROM memberships WHERE id = $1`, [member.membershipId])).rows[0].role
    expect(await roleNow()).toBe('viewer')

    await select.selectOption('analyst')
    await dialog.getByRole('button', { name: 'Change the role' }).click()
    await expect.poll(roleNow).toBe('analyst')
    await expect.poll(() => select.inputValue()).toBe('analyst')
    expect(outsideRequests).toEqual([])
    expect(consoleErrors).toEqual([])
    await context.close()
  })

  it('a run is cancelled only after the dialog is confirmed', async () => {
    const base = inject('baseUrl')
    // A queued run with no work parts (arranged directly, so no worker finishes it first).
    const { rows: [source] } = await pool.query(`SELECT portfolio_id, portfolio_name, assumption_version_id FROM runs WHERE organisation_id = $1 LIMIT 1`, [orgId])
    const { rows: [run] } = await pool.query(
      `INSERT INTO runs (organisation_id, portfolio_id, portfolio_name, name, assumption_version_id, mode, seed, target_rse, max_samples_per_tank, years,
        chunk_size, sites_total, tanks_total, chunks_total, input_hash, engine_version, state)
       VALUES ($1, $2, $3, 'Queued for the dialog test', $4, 'frequency', 1, 0.2, 4000, 1000, 1, 1, 1, 1, 'x', 'test', 'queued') RETURNING id`,
      [orgId, source.portfolio_id, source.portfolio_name, source.assumption_version_id])
    cleanup.push(() => pool.query(`DELETE FROM runs WHERE id = $1`, [run.id]))
    const { page, context, outsideRequests } = await openGuardedPage(browser)
    await signInPage(page, base, ANALYST, DEMO_PASSWORD)
    await page.goto(`${base}/runs/${run.id}`, { waitUntil: 'networkidle' })
    const state = async () => (await pool.query(`SELECT state FROM runs WHERE id = $1`, [run.id])).rows[0].state
    await page.getByTestId('run-cancel').click()
    const dialog = page.getByRole('dialog', { name: 'Cancel this run?' })
    await dialog.waitFor()
    await dialog.getByRole('button', { name: 'Let it run' }).click()
    await dialog.waitFor({ state: 'hidden' })
    expect(await state()).toBe('queued')
    await page.getByTestId('run-cancel').click()
    await dialog.getByRole('button', { name: 'Cancel the run' }).click()
    await expect.poll(state).toBe('cancelled')
    await page.getByText('No result of a cancelled run is shown.').waitFor()
    expect(outsideRequests).toEqual([])
    await context.close()
  })

  it('an assumption value in error is marked beside its field; a saved edit of a used version says which version it became', async () => {
    const base = inject('baseUrl')
    const { page, context, outsideRequests, consoleErrors } = await openGuardedPage(browser)
    await signInPage(page, base, ANALYST, DEMO_PASSWORD)
    const created = await page.evaluate(async () => (await (await fetch('/api/assumption-sets', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ name: `Dialog test set ${Date.now()}` }) })).json()) as { set: { id: string } })
    cleanup.push(() => pool.query(`DELETE FROM assumption_sets WHERE id = $1`, [created.set.id]))
    const { rows: [v1] } = await pool.query(`UPDATE assumption_set_versions SET used_by_run = true WHERE assumption_set_id = $1 RETURNING id`, [created.set.id])
    await page.goto(`${base}/assumptions/versions/${v1.id}`, { waitUntil: 'networkidle' })
    await page.getByRole('button', { name: 'Edit values' }).click()
    await page.locator('input[name="lognormalBeta"]').fill('-0.5')
    await page.getByTestId('assumption-save').click()
    const message = page.locator('[data-field-error="lognormalBeta"]')
    await message.waitFor()
    // The message sits in the same table cell as its input, and the input has the focus.
    expect(await message.evaluate(el => el.closest('td')?.querySelector('input')?.getAttribute('name'))).toBe('lognormalBeta')
    expect(await page.evaluate(() => document.activeElement?.getAttribute('name'))).toBe('lognormalBeta')
    expect(await page.locator('input[name="lognormalBeta"]').getAttribute('aria-invalid')).toBe('true')
    await saveScreenshot(page, 'assumption-field-error')

    await page.locator('input[name="lognormalBeta"]').fill('0.6')
    await page.getByTestId('assumption-save').click()
    await page.waitForURL(url => !url.pathname.endsWith(v1.id))
    expect(await page.getByTestId('assumption-saved').innerText()).toContain('Saved — became version 2')
    expect(outsideRequests).toEqual([])
    expect(consoleErrors).toEqual([])
    await context.close()
  })

  it('deleting an assumption set for good asks in the same dialog first', async () => {
    const base = inject('baseUrl')
    const { page, context, consoleErrors } = await openGuardedPage(browser)
    await signInPage(page, base, ANALYST, DEMO_PASSWORD)
    const name = `Set to delete ${Date.now()}`
    const created = await page.evaluate(async n => (await (await fetch('/api/assumption-sets', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ name: n }) })).json()) as { set: { id: string } }, name)
    cleanup.push(() => pool.query(`DELETE FROM assumption_sets WHERE id = $1`, [created.set.id]))
    await page.goto(`${base}/assumptions`, { waitUntil: 'networkidle' })
    const row = page.locator('tr', { has: page.getByRole('link', { name }) })
    await row.getByRole('button', { name: 'Delete' }).click()
    const dialog = page.getByRole('dialog', { name: `Delete “${name}” for good?` })
    await dialog.waitFor()
    await dialog.getByRole('button', { name: 'Keep it' }).click()
    expect(await row.count()).toBe(1)
    await row.getByRole('button', { name: 'Delete' }).click()
    await dialog.getByRole('button', { name: 'Delete for good' }).click()
    await row.waitFor({ state: 'detached' })
    expect((await pool.query(`SELECT 1 FROM assumption_sets WHERE id = $1`, [created.set.id])).rowCount).toBe(0)
    expect(consoleErrors).toEqual([])
    await context.close()
  })
})
