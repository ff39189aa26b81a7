// Server-side sessions: every sign-in opens a record that each request checks; sign-out revokes
// it, so a copy of the cookie replayed afterwards gets 401 (the attack); the profile lists
// one's sessions and can end them all.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, TEST_PASSWORD, createMember, createOrganisation } from '../support/accounts'
import { testPool } from '../support/db'

const pool = testPool()
afterAll(() => pool.end())

let org: string
beforeAll(async () => {
  org = await createOrganisation(pool, 'Session Operator')
})

/** A second client holding a copy of the first one's cookie (what an attacker replays). */
function copyOf(client: Client): Client {
  const copy = new Client()
  copy.cookie = client.cookie
  return copy
}

async function signedIn(email: string): Promise<Client> {
  const client = new Client()
  expect((await client.signIn(email)).status).toBe(200)
  return client
}

describe('session records', () => {
  it('records each sign-in and refuses a replayed cookie after sign-out', async () => {
    const { email, userId } = await createMember(pool, org, 'analyst')
    const laptop = await signedIn(email)
    const { rows } = await pool.query(`SELECT id, created_at, last_seen_at, revoked_at FROM user_sessions WHERE user_id = $1`, [userId])
    expect(rows).toHaveLength(1)
    expect(rows[0].revoked_at).toBeNull()

    const stolen = copyOf(laptop)
    expect((await stolen.get('/api/_auth/session')).status).toBe(200)
    expect((await laptop.post('/api/auth/sign-out')).status).toBe(200)
    expect((await stolen.get('/api/_auth/session')).status).toBe(401)
    expect((await stolen.get('/api/sites')).status).toBe(401)
    expect((await stolen.post('/api/portfolios', { name: 'After sign-out' })).status).toBe(401)
    const after = await pool.query(`SELECT revoked_at FROM user_sessions WHERE id = $1`, [rows[0].id])
    expect(after.rows[0].revoked_at).not.toBeNull()
  })

  it('checks the record on every request: a session revoked in the database ends at once', async () => {
    const { email, userId } = await createMember(pool, org, 'viewer')
    const client = await signedIn(email)
    expect((await client.get('/api/sites')).status).toBe(200)
    await pool.query(`UPDATE user_sessions SET revoked_at = now() WHERE user_id = $1`, [userId])
    expect((await copyOf(client).get('/api/sites')).status).toBe(401)
  })

  it('ends a session 7 days after sign-in, whatever the cookie says', async () => {
    const { email, userId } = await createMember(pool, org, 'viewer')
    const client = await signedIn(email)
    // 7 days: the session lifetime in the README ("Sessions … last 7 days").
    await pool.query(`UPDATE user_sessions SET created_at = now() - interval '7 days 1 minute' WHERE user_id = $1`, [userId])
    expect((await client.get('/api/_auth/session')).status).toBe(401)
  })

  it('revokes the record when the cookie is cleared through the session module too', async () => {
    const { email } = await createMember(pool, org, 'viewer')
    const client = await signedIn(email)
    const stolen = copyOf(client)
    expect((await client.request('DELETE', '/api/_auth/session')).status).toBe(200)
    expect((await stolen.get('/api/_auth/session')).status).toBe(401)
  })

  it('lists the person\'s own sessions and signs out everywhere', async () => {
    const { email } = await createMember(pool, org, 'underwriter')
    const other = await createMember(pool, org, 'underwriter')
    const laptop = await signedIn(email)
    const phone = await signedIn(email)
    const someoneElse = await signedIn(other.email)

    const res = await laptop.get('/api/auth/sessions')
    expect(res.status).toBe(200)
    const { sessions } = await res.json() as { sessions: { id: string, current: boolean, createdAt: string, lastSeenAt: string }[] }
    expect(sessions).toHaveLength(2) // laptop and phone; never someone else's
    expect(sessions.filter(s => s.current)).toHaveLength(1)

    const ended = await laptop.post('/api/auth/sessions/sign-out-everywhere')
    expect(ended.status).toBe(200)
    expect((await ended.json()).sessionsEnded).toBe(2)
    expect((await phone.get('/api/_auth/session')).status).toBe(401)
    expect((await copyOf(laptop).get('/api/_auth/session')).status).toBe(401)
    expect((await someoneElse.get('/api/_auth/session')).status).toBe(200)
    // Signing in again works.
    expect((await new Client().signIn(email, TEST_PASSWORD)).status).toBe(200)
  })

  it('keeps the current session and ends the others when the password changes', async () => {
    const { email } = await createMember(pool, org, 'asset_manager')
    const laptop = await signedIn(email)
    const phone = await signedIn(email)
    const res = await laptop.post('/api/auth/change-password', { currentPassword: TEST_PASSWORD, newPassword: 'another long passphrase' })
    expect(res.status).toBe(200)
    expect((await laptop.get('/api/_auth/session')).status).toBe(200)
    expect((await phone.get('/api/_auth/session')).status).toBe(401)
    expect((await (await laptop.get('/api/auth/sessions')).json()).sessions).toHaveLength(1)
  })

  it('keeps the same session record when switching organisation', async () => {
    const second = await createOrganisation(pool, 'Session Second Insurer', 'insurer')
    const { email, userId } = await createMember(pool, org, 'viewer')
    await createMember(pool, second, 'admin', email)
    const client = await signedIn(email)
    expect((await client.post('/api/auth/switch-organisation', { organisationId: second })).status).toBe(200)
    const { rows } = await pool.query(`SELECT count(*)::int AS n FROM user_sessions WHERE user_id = $1 AND revoked_at IS NULL`, [userId])
    expect(rows[0].n).toBe(1)
    expect((await client.get('/api/members')).status).toBe(200)
  })
})
