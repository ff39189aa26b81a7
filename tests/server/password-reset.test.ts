// Password reset by e-mail: same answer for known and unknown addresses, single-use one-hour links,
// every session ends after a reset.
import { createHash } from 'node:crypto'
import { afterAll, describe, expect, it } from 'vitest'
import { Client, TEST_PASSWORD, createMember, createOrganisation } from '../support/accounts'
import { testPool } from '../support/db'
import { linkIn, mailTo, waitForMail } from '../support/mail'

const pool = testPool()
afterAll(() => pool.end())

async function requestLink(email: string): Promise<string> {
  const since = new Date()
  const res = await new Client().post('/api/auth/reset-password', { email })
  expect(res.status).toBe(200)
  const mail = await waitForMail(pool, email, since)
  expect(mail.subject).toContain('Stormledger')
  return linkIn(mail.body, '/reset-password/').token
}

describe('password reset', () => {
  it('answers the same whether or not the address has an account, and mails only a real account', async () => {
    const org = await createOrganisation(pool, 'Reset Operator')
    const { email } = await createMember(pool, org, 'analyst')
    const known = await new Client().post('/api/auth/reset-password', { email })
    const unknown = await new Client().post('/api/auth/reset-password', { email: 'no.such.person@example.test' })
    expect(known.status).toBe(unknown.status)
    expect(await known.json()).toEqual(await unknown.json())
    await waitForMail(pool, email, new Date(Date.now() - 5000))
    await new Promise(r => setTimeout(r, 1500)) // the worker had time to send anything queued
    expect(await mailTo(pool, 'no.such.person@example.test')).toEqual([])
  })

  it('answers both paths the same way, before looking the address up: one queued job each', async () => {
    const org = await createOrganisation(pool, 'Reset Queue Operator')
    const { email } = await createMember(pool, org, 'viewer')
    const unknownEmail = 'nobody.queued@example.test'
    const known = await new Client().post('/api/auth/reset-password', { email })
    const unknown = await new Client().post('/api/auth/reset-password', { email: unknownEmail })
    expect(known.status).toBe(200)
    expect(unknown.status).toBe(200)
    expect(await known.json()).toEqual(await unknown.json())
    // The handler only enqueues: the same job, with the same payload shape, for both addresses.
    const jobs = async (address: string) => (await pool.query(`SELECT name, data FROM pgboss.job WHERE name = 'auth.password-reset' AND data->>'email' = $1`, [address])).rows
    const knownJobs = await jobs(email)
    const unknownJobs = await jobs(unknownEmail)
    expect(knownJobs).toHaveLength(1)
    expect(unknownJobs).toHaveLength(1)
    expect(Object.keys(knownJobs[0].data).sort()).toEqual(Object.keys(unknownJobs[0].data).sort())
    // The worker then mails the real account only.
    expect((await waitForMail(pool, email, new Date(Date.now() - 5000))).body).toContain('/reset-password/')
    await new Promise(r => setTimeout(r, 1500))
    expect(await mailTo(pool, unknownEmail)).toEqual([])
  })

  it('sets a new password once, ends every session of the person, and refuses the link afterwards', async () => {
    const org = await createOrganisation(pool, 'Reset Sessions Operator')
    const { email, userId } = await createMember(pool, org, 'viewer')
    const laptop = new Client()
    const phone = new Client()
    await laptop.signIn(email)
    await phone.signIn(email)
    expect((await laptop.get('/api/_auth/session')).status).toBe(200)

    const token = await requestLink(email)
    expect((await new Client().get(`/api/auth/reset-password/${token}`)).status).toBe(200)
    // The rules: at least 12 characters, not the e-mail address.
    expect((await new Client().post(`/api/auth/reset-password/${token}`, { password: 'short' })).status).toBe(400)
    const sameAsEmail = await new Client().post(`/api/auth/reset-password/${token}`, { password: email })
    expect(sameAsEmail.status).toBe(400)
    expect((await sameAsEmail.json()).statusMessage).toMatch(/e-mail/)

    const since = new Date()
    expect((await new Client().post(`/api/auth/reset-password/${token}`, { password: 'a brand new passphrase' })).status).toBe(200)
    // Every session that began before the reset has ended.
    expect((await laptop.get('/api/_auth/session')).status).toBe(401)
    expect((await phone.get('/api/members')).status).toBe(401)
    expect((await new Client().signIn(email, TEST_PASSWORD)).status).toBe(401)
    expect((await new Client().signIn(email, 'a brand new passphrase')).status).toBe(200)
    expect((await waitForMail(pool, email, since)).subject).toMatch(/password was changed/)

    // Single use.
    expect((await new Client().get(`/api/auth/reset-password/${token}`)).status).toBe(410)
    expect((await new Client().post(`/api/auth/reset-password/${token}`, { password: 'yet another passphrase' })).status).toBe(410)
    const actions = (await pool.query(`SELECT action FROM audit_events WHERE user_id = $1 AND action LIKE 'password%' ORDER BY at`, [userId])).rows.map(r => r.action)
    expect(actions).toEqual(['password_reset_request', 'password_reset'])
  })

  it('refuses a link older than one hour, and every earlier link once one was used', async () => {
    const org = await createOrganisation(pool, 'Reset Expiry Operator')
    const { email } = await createMember(pool, org, 'viewer')
    const first = await requestLink(email)
    const second = await requestLink(email)
    const firstHash = createHash('sha256').update(first).digest('hex') // the database keeps only the SHA-256
    await pool.query(`UPDATE password_reset_tokens SET expires_at = now() - interval '1 second' WHERE token_hash = $1`, [firstHash])
    expect((await new Client().get(`/api/auth/reset-password/${first}`)).status).toBe(410)
    expect((await new Client().post(`/api/auth/reset-password/${first}`, { password: 'expired link passphrase' })).status).toBe(410)
    const third = await requestLink(email)
    expect((await new Client().post(`/api/auth/reset-password/${third}`, { password: 'the third link works' })).status).toBe(200)
    expect((await new Client().post(`/api/auth/reset-password/${second}`, { password: 'the second link is dead' })).status).toBe(410)
    expect((await new Client().get('/api/auth/reset-password/not-a-token-we-ever-made-at-all')).status).toBe(404)
  })

  it('issues a link that lasts one hour', async () => {
    const org = await createOrganisation(pool, 'Reset Lifetime Operator')
    const { email, userId } = await createMember(pool, org, 'viewer')
    await requestLink(email)
    const { rows } = await pool.query(`SELECT extract(epoch FROM expires_at - created_at) AS seconds FROM password_reset_tokens WHERE user_id = $1`, [userId])
    expect(Number(rows[0].seconds)).toBeCloseTo(3600, -1) // the rule: 1 hour
  })
})
