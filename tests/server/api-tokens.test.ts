// Personal API tokens (README "Scripted access"): made on the profile (POST /api/auth/tokens), the
// secret answered once and stored only as its SHA-256; `Authorization: Bearer` acts as the owner
// with the owner's role read on every request; revocation, a role change, removal and a password
// change take effect on the next request; last use recorded; changes audited with `via`.
import { createHash } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, bearerClient, createMember, createOrganisation, memberClient, TEST_PASSWORD } from '../support/accounts'
import { testPool } from '../support/db'
import { defaultAssumptions } from '../../shared/engine/assumptions'
import { createDefaultAssumptions, createFleet } from '../support/fleet'
import { waitForRun } from '../support/runs'

const pool = testPool()
afterAll(() => pool.end())

let org: string
let otherOrg: string
beforeAll(async () => {
  org = await createOrganisation(pool, 'Token Operator')
  otherOrg = await createOrganisation(pool, 'Token Other Insurer', 'insurer')
})

/** A UTC calendar day `days` from today, YYYY-MM-DD. */
function inDays(days: number): string {
  return new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10)
}

async function signedIn(email: string): Promise<Client> {
  const client = new Client()
  expect((await client.signIn(email)).status).toBe(200)
  return client
}

async function makeToken(client: Client, body: Record<string, unknown>): Promise<{ id: string, secret: string, display: string }> {
  const res = await client.post('/api/auth/tokens', { expiresOn: inDays(90), ...body })
  const json = await res.json() as { id: string, secret: string, display: string }
  expect(res.status, JSON.stringify(json)).toBe(201)
  return json
}

describe('making a token', () => {
  it('answers the secret once, keeps only its SHA-256 and its last 4 characters', async () => {
    const { email, userId } = await createMember(pool, org, 'analyst')
    const person = await signedIn(email)
    const made = await makeToken(person, { name: 'nightly script' })
    expect(made.secret).toMatch(/^slk_[A-Za-z0-9_-]{43}$/) // prefix + 32 bytes in base64url = 43 characters (RFC 4648 §5)
    const { rows } = await pool.query(`SELECT * FROM api_tokens WHERE user_id = $1`, [userId])
    expect(rows).toHaveLength(1)
    // SHA-256 of the secret, computed here independently (FIPS 180-4 via node:crypto).
    expect(rows[0].token_hash).toBe(createHash('sha256').update(made.secret).digest('hex'))
    expect(rows[0].last_four).toBe(made.secret.slice(-4))
    expect(made.display).toBe(`slk_…${made.secret.slice(-4)}`)
    // The secret appears nowhere in the table, nor in the audit trail (hand-checked rule of the issue).
    const table = JSON.stringify((await pool.query(`SELECT * FROM api_tokens`)).rows)
    expect(table).not.toContain(made.secret)
    expect(table).not.toContain(made.secret.slice(4, 20))
    const audit = JSON.stringify((await pool.query(`SELECT * FROM audit_events WHERE entity = 'api_token'`)).rows)
    expect(audit).not.toContain(made.secret)
    // The list shows it without the secret.
    const list = await (await person.get('/api/auth/tokens')).json() as { tokens: Record<string, unknown>[] }
    expect(list.tokens.map(t => t.name)).toEqual(['nightly script'])
    expect(JSON.stringify(list)).not.toContain(made.secret)
    // The expiry is the end of the chosen UTC day (the form's rule in shared/schemas/auth.ts).
    expect(new Date(rows[0].expires_at).toISOString()).toBe(`${inDays(90)}T23:59:59.999Z`)
  })

  it('refuses an expiry more than a year ahead or in the past, and an organisation one does not belong to', async () => {
    const person = await memberClient(pool, org, 'viewer')
    const far = await person.post('/api/auth/tokens', { name: 'too long', expiresOn: inDays(400) })
    expect(far.status).toBe(400)
    expect(((await far.json()) as { data: { fields: Record<string, string> } }).data.fields.expiresOn).toMatch(/one year/)
    expect((await person.post('/api/auth/tokens', { name: 'past', expiresOn: inDays(-1) })).status).toBe(400)
    expect((await person.post('/api/auth/tokens', { name: 'elsewhere', expiresOn: inDays(30), organisationId: otherOrg })).status).toBe(400)
  })

  it('acts in the organisation chosen when made, not the session\'s current one', async () => {
    const { email, userId } = await createMember(pool, org, 'viewer')
    await createMember(pool, otherOrg, 'analyst', email)
    const person = await signedIn(email)
    const made = await makeToken(person, { name: 'other org', organisationId: otherOrg })
    const { rows } = await pool.query(`SELECT organisation_id FROM api_tokens WHERE user_id = $1`, [userId])
    expect(rows[0].organisation_id).toBe(otherOrg)
    const script = bearerClient(made.secret)
    // Analyst in the other organisation: may make a portfolio there (README roles table).
    const res = await script.post('/api/portfolios', { name: 'Made by token elsewhere' })
    expect(res.status).toBeLessThan(300)
    const p = await pool.query(`SELECT organisation_id FROM portfolios WHERE name = 'Made by token elsewhere'`)
    expect(p.rows[0].organisation_id).toBe(otherOrg)
  })
})

describe('calling with a token', () => {
  it('acts with the owner\'s role, records last use and audits changes with the token\'s name', async () => {
    const { email, userId } = await createMember(pool, org, 'analyst')
    const person = await signedIn(email)
    const made = await makeToken(person, { name: 'inventory sync' })
    const script = bearerClient(made.secret)
    expect((await script.get('/api/portfolios')).status).toBe(200)
    const used = await pool.query(`SELECT last_used_at, last_used_address FROM api_tokens WHERE id = $1`, [made.id])
    expect(used.rows[0].last_used_at).not.toBeNull()
    expect(used.rows[0].last_used_address).toMatch(/127\.0\.0\.1|::1/)
    const created = await script.post('/api/portfolios', { name: 'Token portfolio' })
    expect(created.status).toBeLessThan(300)
    const audit = await pool.query(`SELECT user_id, action, via FROM audit_events WHERE entity = 'portfolio' AND user_id = $1`, [userId])
    expect(audit.rows).toEqual([{ user_id: userId, action: 'create', via: 'token inventory sync' }])
    // The same change made with the session says nothing of a token.
    await person.post('/api/portfolios', { name: 'Session portfolio' })
    const both = await pool.query(`SELECT via FROM audit_events WHERE entity = 'portfolio' AND user_id = $1 ORDER BY at`, [userId])
    expect(both.rows.map(r => r.via)).toEqual(['token inventory sync', null])
    // Admin → Audit log shows it.
    const admin = await memberClient(pool, org, 'admin')
    const log = await (await admin.get('/api/audit?entity=portfolio')).json() as { events: { via: string | null, person: { id: string } | null }[] }
    expect(log.events.filter(e => e.person?.id === userId).map(e => e.via)).toEqual([null, 'token inventory sync']) // newest first
    // Last use is written at most once a minute: a second call within it leaves the time as it was.
    const before = (await pool.query(`SELECT last_used_at FROM api_tokens WHERE id = $1`, [made.id])).rows[0].last_used_at
    await script.get('/api/portfolios')
    const after = (await pool.query(`SELECT last_used_at FROM api_tokens WHERE id = $1`, [made.id])).rows[0].last_used_at
    expect(after).toEqual(before)
  })

  it('stops at once when revoked, and the owner\'s revocation is audited', async () => {
    const { email, userId } = await createMember(pool, org, 'viewer')
    const person = await signedIn(email)
    const made = await makeToken(person, { name: 'to revoke' })
    const script = bearerClient(made.secret)
    expect((await script.get('/api/portfolios')).status).toBe(200)
    expect((await person.delete(`/api/auth/tokens/${made.id}`)).status).toBe(200)
    const refused = await script.get('/api/portfolios')
    expect(refused.status).toBe(401)
    expect(((await refused.json()) as { message: string }).message).toMatch(/revoked/)
    const audit = await pool.query(`SELECT action FROM audit_events WHERE entity = 'api_token' AND entity_id = $1 ORDER BY at`, [made.id])
    expect(audit.rows.map(r => r.action)).toEqual(['create', 'revoke'])
    expect((await pool.query(`SELECT revoked_by_id FROM api_tokens WHERE id = $1`, [made.id])).rows[0].revoked_by_id).toBe(userId)
    // Gone from the list; revoking again answers 404.
    expect(((await (await person.get('/api/auth/tokens')).json()) as { tokens: unknown[] }).tokens).toEqual([])
    expect((await person.delete(`/api/auth/tokens/${made.id}`)).status).toBe(404)
  })

  it('follows a role change, a removal and a password change on the next request', async () => {
    const admin = await memberClient(pool, org, 'admin')
    const { email, membershipId } = await createMember(pool, org, 'analyst')
    const person = await signedIn(email)
    const script = bearerClient((await makeToken(person, { name: 'role follows' })).secret)
    expect((await script.post('/api/portfolios', { name: 'While analyst' })).status).toBeLessThan(300)
    expect((await admin.patch(`/api/members/${membershipId}`, { role: 'viewer' })).status).toBe(200)
    expect((await script.post('/api/portfolios', { name: 'While viewer' })).status).toBe(403) // viewers read only (README roles)
    expect((await script.get('/api/portfolios')).status).toBe(200)

    const second = bearerClient((await makeToken(person, { name: 'password follows' })).secret)
    expect((await second.get('/api/portfolios')).status).toBe(200)
    expect((await person.post('/api/auth/change-password', { currentPassword: TEST_PASSWORD, newPassword: 'a new long password 2026' })).status).toBe(200)
    const ended = await second.get('/api/portfolios')
    expect(ended.status).toBe(401)
    expect(((await ended.json()) as { message: string }).message).toMatch(/password/)

    const third = bearerClient((await makeToken(person, { name: 'removal follows' })).secret)
    expect((await third.get('/api/portfolios')).status).toBe(200)
    expect((await admin.delete(`/api/members/${membershipId}`)).status).toBe(200)
    expect((await third.get('/api/portfolios')).status).toBe(401)
  })

  it('refuses a read-only token on writes with its own message, and every token on token and sign-in routes', async () => {
    const person = await memberClient(pool, org, 'analyst')
    const made = await makeToken(person, { name: 'read only', readOnly: true })
    const script = bearerClient(made.secret)
    expect((await script.get('/api/portfolios')).status).toBe(200)
    const write = await script.post('/api/portfolios', { name: 'Refused' })
    expect(write.status).toBe(403)
    expect(((await write.json()) as { message: string }).message).toBe('This token is read-only.')
    const full = bearerClient((await makeToken(person, { name: 'full' })).secret)
    for (const [method, path] of [['GET', '/api/auth/tokens'], ['POST', '/api/auth/tokens'], ['GET', '/api/auth/sessions'], ['POST', '/api/auth/change-password'], ['GET', '/api/tokens']] as const) {
      expect((await full.request(method, path, method === 'GET' ? undefined : {})).status, `${method} ${path}`).toBe(403)
    }
  })

  it('answers an unknown or malformed token 401 with how to send one', async () => {
    expect((await bearerClient('slk_not-a-real-token').get('/api/portfolios')).status).toBe(401)
    const wrong = await bearerClient('abc').get('/api/portfolios')
    expect(wrong.status).toBe(401)
    expect(((await wrong.json()) as { message: string }).message).toMatch(/slk_/)
  })

  it('lets a script\'s write through without Origin, and from any Origin when it carries no cookie; a cookie keeps the cross-site check', async () => {
    const { email } = await createMember(pool, org, 'analyst')
    const person = await signedIn(email)
    const made = await makeToken(person, { name: 'origin' })
    const script = bearerClient(made.secret)
    expect((await script.post('/api/portfolios', { name: 'No origin' })).status).toBeLessThan(300)
    expect((await script.request('POST', '/api/portfolios', { name: 'Some origin' }, { origin: 'http://elsewhere.example' })).status).toBeLessThan(300)
    // The session cookie and a forged origin: refused as today, whatever bearer rides along.
    expect((await person.request('POST', '/api/portfolios', { name: 'Forged' }, { origin: 'http://elsewhere.example', authorization: `Bearer ${made.secret}` })).status).toBe(403)
  })
})

describe('admins and the organisation\'s tokens', () => {
  it('lists every member\'s open token and revokes one; others\' organisations are not theirs', async () => {
    const admin = await memberClient(pool, org, 'admin')
    const { email } = await createMember(pool, org, 'underwriter')
    const person = await signedIn(email)
    const made = await makeToken(person, { name: 'underwriter export' })
    const list = await (await admin.get('/api/tokens')).json() as { tokens: { id: string, ownerEmail: string }[] }
    expect(list.tokens.find(t => t.id === made.id)?.ownerEmail).toBe(email)
    const otherAdmin = await memberClient(pool, otherOrg, 'admin')
    expect((await otherAdmin.delete(`/api/tokens/${made.id}`)).status).toBe(404)
    expect((await admin.delete(`/api/tokens/${made.id}`)).status).toBe(200)
    expect((await bearerClient(made.secret).get('/api/portfolios')).status).toBe(401)
  })
})

describe('the README\'s script (Scripted access)', () => {
  it('starts a run and downloads its workbook with an analyst\'s token alone', async () => {
    const person = await memberClient(pool, org, 'analyst')
    const script = bearerClient((await makeToken(person, { name: 'readme script' })).secret)
    const portfolioId = await createFleet(pool, org, { sites: 1, tanksPerSite: 1, seed: 'token-readme', name: 'Token readme fleet' })
    const versionId = await createDefaultAssumptions(pool, org, defaultAssumptions)
    // The same routes and body as the README's curl lines (fewer years, to keep the test short).
    const started = await script.post('/api/runs', { portfolioId, assumptionVersionId: versionId, mode: 'year', seed: 42, years: 200 })
    expect(started.status, await started.clone().text()).toBe(201)
    const { id } = await started.json() as { id: string }
    const audit = await pool.query(`SELECT via FROM audit_events WHERE entity = 'run' AND entity_id = $1`, [id])
    expect(audit.rows).toEqual([{ via: 'token readme script' }])
    const run = await waitForRun(script, id)
    expect(run.state).toBe('succeeded')
    const workbook = await script.get(`/api/runs/${id}/export`)
    expect(workbook.status).toBe(200)
    const bytes = new Uint8Array(await workbook.arrayBuffer())
    // An .xlsx is a zip: it starts with the local file header signature "PK\x03\x04" (APPNOTE.TXT §4.3.7).
    expect([...bytes.slice(0, 4)]).toEqual([0x50, 0x4B, 0x03, 0x04])
  }, 120_000)
})
