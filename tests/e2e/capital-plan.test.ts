// In a real browser: the demo operator's admin proposes shields, evaluates them, turns a budget into
// a plan, sees the efficient frontier and exports the plan.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import ExcelJS from 'exceljs'
import { launchBrowser, openGuardedPage, saveScreenshot } from '../support/browser'
import { DEMO_PASSWORD } from '../../server/db/seed/accounts'
import { CAUTION_TEXT } from '../../shared/caution'

let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close() })

describe('capital plan', () => {
  it('builds a plan for a budget, shows the frontier and exports the plan', async () => {
    const base = inject('baseUrl')
    const { page, context, outsideRequests, consoleErrors } = await openGuardedPage(browser)
    await page.goto(`${base}/sign-in`)
    await page.getByLabel('E-mail').fill('admin@dunmere.example')
    await page.getByLabel('Password').fill(DEMO_PASSWORD)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.waitForURL(`${base}/overview`)
    await page.getByRole('link', { name: 'Capital plan' }).first().click()
    await page.waitForURL(`${base}/capital-plan`)

    // "Shield every FRP tank holding crude taller than 5 m" (the form's default filter).
    const shield = await page.getByTestId('add-option').locator('option', { hasText: 'shield' }).first().getAttribute('value')
    await page.getByTestId('add-option').selectOption(shield!)
    await page.getByTestId('add-actions').click()
    await expect.poll(() => page.getByTestId('capital-message').innerText()).toMatch(/\d+ actions? added/)
    await expect.poll(() => page.getByTestId('action-row').count()).toBeGreaterThan(0)

    await page.getByTestId('evaluate').click()
    await expect.poll(() => page.getByTestId('evaluation-status').innerText(), { timeout: 120_000 }).toContain('succeeded')

    await page.getByTestId('budget').fill('60000')
    await page.getByTestId('find-plan').click()
    await expect.poll(() => page.getByTestId('plan-totals').innerText()).toMatch(/actions, .* of /)
    await page.getByTestId('frontier-chart').locator('canvas').first().waitFor()
    await page.getByTestId('plan-name').fill('Sixty thousand shields')
    await page.getByTestId('save-plan').click()
    await expect.poll(() => page.getByTestId('plan-row').count()).toBe(1)
    await saveScreenshot(page, 'capital-plan')

    const href = await page.getByTestId('export-plan').first().locator('button').getAttribute('data-href')
    const res = await page.request.get(`${base}${href}`)
    expect(res.status()).toBe(200)
    const wb = new ExcelJS.Workbook()
    await wb.xlsx.load((await res.body()) as unknown as ExcelJS.Buffer)
    expect(String(wb.getWorksheet('Caution')!.getCell(1, 1).value)).toContain(CAUTION_TEXT.short)
    expect(outsideRequests).toEqual([])
    expect(consoleErrors).toEqual([])
    await context.close()
  })
})
