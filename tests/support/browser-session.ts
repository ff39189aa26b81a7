// Signing a browser page in through the sign-in API (kept apart so it can switch to the sign-in form later).
import type { Page } from 'playwright-core'
import { TEST_PASSWORD } from './accounts'

export async function signInPage(page: Page, baseUrl: string, email: string, password = TEST_PASSWORD): Promise<void> {
  await page.goto(`${baseUrl}/`, { waitUntil: 'domcontentloaded' })
  const status = await page.evaluate(async ([e, p]) => {
    const res = await fetch('/api/auth/sign-in', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: e, password: p }) })
    return res.status
  }, [email, password] as const)
  if (status !== 200) throw new Error(`browser sign-in failed with ${status}`)
}
