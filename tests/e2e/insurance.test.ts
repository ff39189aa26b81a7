// In a real browser: an underwriter puts terms on every site of a portfolio, reads the insured
// losses and the technical premium of a run, and changes the deductible to see its effect at once.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { defaultAssumptions } from '../../shared/engine/assumptions'
import { launchBrowser, openGuardedPage, saveScreenshot } from '../support/browser'
import { signInPage } from '../support/browser-session'
import { createMember, createOrganisation } from '../support/accounts'
import { testPool } from '../support/db'
import { createDefaultAssumptions, createFleet } from '../support/fleet'
import { insertHandMadeRun } from '../support/insurance'

const pool = testPool()
let browser: Browser
beforeAll(async () => { browser = await launchBrowser() })
afterAll(async () => { await browser?.close(); await pool.end() })

describe('insurance terms in the browser', () => {
  it('puts terms on the sites, shows insured losses and premium, and evaluates a deductible change', async () => {
    const base = inject('baseUrl')
    const org = await createOrganisation(pool, 'Browser Terms Insurer', 'insurer')
    const { email } = await createMember(pool, org, 'underwriter')
    const portfolioId = await createFleet(pool, org, { sites: 2, tanksPerSite: 1, seed: 'terms-e2e', name: 'Browser terms fleet' })
    const assumptionVersionId = await createDefaultAssumptions(pool, org, defaultAssumptions)
    const { rows } = await pool.query(`SELECT site_id FROM portfolio_sites WHERE portfolio_id = $1 ORDER BY site_id`, [portfolioId])
    const [a, b] = rows.map(r => r.site_id as string)
    // Ten years. A: year 0 events 100 then 300, year 1: 50, year 2: 1000. B: year 0: 200, year 5: 600.
    const runId = await insertHandMadeRun(pool, { organisationId: org, portfolioId, assumptionVersionId, years: 10, siteEvents: { [a!]: [[0, 100], [0, 300], [1, 50], [2, 1000]], [b!]: [[0, 200], [5, 600]] } })

    const { page, context, outsideRequests, consoleErrors } = await openGuardedPage(browser)
    await signInPage(page, base, email)
    await page.goto(`${base}/insurance`)
    await page.getByLabel('Portfolio').selectOption({ label: 'Browser terms fleet' })
    await page.getByLabel('Name', { exact: true }).fill('Browser book terms')
    await page.getByRole('button', { name: 'Create terms' }).click()
    await page.waitForURL(/\/insurance\/[0-9a-f-]{36}/)
    await page.getByLabel('Occurrence deductible', { exact: true }).fill('80')
    await page.getByLabel('Occurrence limit', { exact: true }).fill('400')
    await page.getByLabel('Aggregate deductible', { exact: true }).fill('100')
    await page.getByLabel('Aggregate limit', { exact: true }).fill('500')
    await page.getByLabel('Share (%)', { exact: true }).fill('50')
    await page.getByRole('button', { name: 'Set for every site' }).click()
    await page.getByRole('button', { name: 'Save terms' }).click()
    await page.getByText('Saved.').waitFor()
    await saveScreenshot(page, 'insurance-terms-editor')

    // The run was written by hand, so record the saved version for it as a run start would.
    await pool.query(`INSERT INTO run_terms (run_id, terms_version_id) SELECT $1, v.id FROM policy_terms_versions v JOIN policy_terms_sets s ON s.id = v.terms_set_id WHERE s.portfolio_id = $2`, [runId, portfolioId])
    await page.goto(`${base}/runs/${runId}/financial`)
    await page.getByLabel('Tail return period (years)').fill('5')
    await page.getByLabel('Tail return period (years)').press('Tab')
    // A: insured 70 + 150 = 220; B: occurrence-net 120 and 400 → 20 and 300 after the aggregate deductible → 160 insured; (220 + 160) / 10 = 38.
    await expect.poll(() => page.getByTestId('figure-insured-aal').innerText()).toContain('USD 38 /yr')
    // Every site at a 500 deductible: A keeps 1000 → 400 − 100 = 300 → 150; B: 600 → 100, all under the aggregate deductible → 0. 150 / 10 = 15.
    await page.getByLabel(/^Occurrence deductible/).fill('500')
    await page.getByLabel(/^Occurrence deductible/).press('Tab')
    await expect.poll(() => page.getByTestId('whatif-insured-aal').innerText()).toContain('USD 15 /yr')
    await saveScreenshot(page, 'insurance-financial-view')
    expect(outsideRequests).toEqual([])
    expect(consoleErrors).toEqual([])
    await context.close()
  })
})
