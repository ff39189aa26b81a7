// Sign-in, throttling and sign-out.
import { afterAll, beforeEach, describe, expect, it } from 'vitest'
import { Client, TEST_PASSWORD, createMember, createOrganisation } from '../support/accounts'
import { testPool } from '../support/db'

const pool = testPool()
afterAll(() => pool.end())
// Attempts from this test client all come from 127.0.0.1; each test starts with no counted failures.
beforeEach(async () => { await pool.query('DELETE FROM sign_in_attempts') })

const auditActions = async (userId: string) =>
  (await pool.query(`SELECT action FROM audit_events WHERE user_id = $1 ORDER BY at`, [userId])).rows.map(r => r.action)

describe('POST /api/auth/sign-in', () => {
  it('starts a session with the right password and refuses a wrong one with the same message as an unknown e-mail', async () => {
    const org = await createOrganisation(pool, 'Sign-in Test Operator')
    const { email, userId } = await createMember(pool, org, 'analyst')
    const good = new Client()
    const res = await good.signIn(email)
    expect(res.status).toBe(200)
    expect((await res.json()).role).toBe('analyst')
    expect(good.cookie).toMatch(/^nuxt-session=/)

    const wrong = await new Client().signIn(email, 'not the password at all')
    const unknown = await new Client().signIn('nobody@example.test', 'not the password at all')
    expect(wrong.status).toBe(401)
    expect(unknown.status).toBe(401)
    // No account enumeration: both answers say the same (common practice, OWASP authentication guidance).
    expect((await wrong.json()).statusMessage).toBe((await unknown.json()).statusMessage)

    // Both outcomes are audited; the e-mail is matched case-insensitively.
    expect((await new Client().signIn(email.toUpperCase())).status).toBe(200)
    expect(await auditActions(userId)).toEqual(['sign_in', 'sign_in_failed', 'sign_in'])
  })

  it('answers 429 with Retry-After after 10 failures for one account within 15 minutes, even with the right password', async () => {
    const org = await createOrganisation(pool, 'Throttle Operator')
    const { email } = await createMember(pool, org, 'viewer')
    for (let i = 0; i < 10; i++) expect((await new Client().signIn(email, `wrong password ${i}`)).status).toBe(401)
    const blocked = await new Client().signIn(email, TEST_PASSWORD)
    expect(blocked.status).toBe(429)
    const retryAfter = Number(blocked.headers.get('retry-after'))
    // The window is 15 minutes (the rule), so the wait is at most 900 s.
    expect(retryAfter).toBeGreaterThan(800)
    expect(retryAfter).toBeLessThanOrEqual(900)

    // Once the failures are older than 15 minutes, the right password works again.
    await pool.query(`UPDATE sign_in_attempts SET at = at - interval '16 minutes'`)
    expect((await new Client().signIn(email)).status).toBe(200)
  })

  it('answers 429 after 10 failures from one address, for unknown and known e-mails alike', async () => {
    const org = await createOrganisation(pool, 'Address Throttle Operator')
    const { email } = await createMember(pool, org, 'viewer')
    for (let i = 0; i < 10; i++) expect((await new Client().signIn(`stranger${i}@example.test`, 'wrong password')).status).toBe(401)
    const known = await new Client().signIn(email)
    const unknown = await new Client().signIn('another.stranger@example.test', 'wrong password')
    expect(known.status).toBe(429)
    expect(unknown.status).toBe(429)
    expect((await known.json()).statusMessage).toBe((await unknown.json()).statusMessage)
    expect(Number(unknown.headers.get('retry-after'))).toBeGreaterThan(0)
  })

  it('counts failures for unknown e-mails like known ones, so throttling reveals nothing', async () => {
    for (let i = 0; i < 10; i++) await new Client().signIn('ghost@example.test', 'wrong password')
    await pool.query(`UPDATE sign_in_attempts SET ip_address = 'elsewhere'`) // only the per-account count is left
    expect((await new Client().signIn('ghost@example.test', 'wrong password')).status).toBe(429)
  })

  it('keeps the account count apart from other accounts and clears it on success', async () => {
    const org = await createOrganisation(pool, 'Reset Count Operator')
    const { email } = await createMember(pool, org, 'viewer')
    for (let i = 0; i < 9; i++) await new Client().signIn(email, 'wrong password')
    expect((await new Client().signIn(email)).status).toBe(200)
    await pool.query(`UPDATE sign_in_attempts SET ip_address = 'elsewhere'`)
    expect((await new Client().signIn(email, 'wrong again')).status).toBe(401)
    expect((await new Client().signIn(email)).status).toBe(200)
  })

  it('refuses a person without any membership, and a disabled account like a wrong password', async () => {
    const org = await createOrganisation(pool, 'Disabled Operator')
    const { email, userId } = await createMember(pool, org, 'viewer')
    await pool.query(`UPDATE users SET disabled = true WHERE id = $1`, [userId])
    expect((await new Client().signIn(email)).status).toBe(401)
    await pool.query(`UPDATE users SET disabled = false WHERE id = $1`, [userId])
    await pool.query(`DELETE FROM memberships WHERE user_id = $1`, [userId])
    expect((await new Client().signIn(email)).status).toBe(403)
  })
})

describe('POST /api/auth/sign-out', () => {
  it('ends the session and is audited', async () => {
    const org = await createOrganisation(pool, 'Sign-out Operator')
    const { email, userId } = await createMember(pool, org, 'underwriter')
    const client = new Client()
    await client.signIn(email)
    expect((await client.get('/api/_auth/session')).status).toBe(200)
    expect((await client.post('/api/auth/sign-out')).status).toBe(200)
    expect(client.cookie).toBe('')
    expect((await client.get('/api/_auth/session')).status).toBe(401)
    expect(await auditActions(userId)).toEqual(['sign_in', 'sign_out'])
  })
})
