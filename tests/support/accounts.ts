import { createHash, randomBytes } from 'node:crypto'
// Arranging people for route tests: organisations, members with a role, signed-in clients.
import { inject } from 'vitest'
import type pg from 'pg'
import { hashPasswordOutsideNitro } from '../../server/accounts/password-hash'

export const TEST_PASSWORD = 'correct horse battery staple'
export type RoleName = 'admin' | 'analyst' | 'underwriter' | 'asset_manager' | 'viewer'
export const ALL_ROLES: RoleName[] = ['admin', 'analyst', 'underwriter', 'asset_manager', 'viewer']

let cachedHash: string | undefined
async function testPasswordHash() {
  cachedHash ??= await hashPasswordOutsideNitro(TEST_PASSWORD)
  return cachedHash
}

export async function createOrganisation(pool: pg.Pool, name: string, kind = 'operator'): Promise<string> {
  const { rows } = await pool.query(`INSERT INTO organisations (name, kind) VALUES ($1, $2) RETURNING id`, [name, kind])
  return rows[0].id
}

export async function createMember(pool: pg.Pool, organisationId: string, role: RoleName, email?: string): Promise<{ userId: string, email: string, membershipId: string }> {
  const address = (email ?? `${role}.${Math.random().toString(36).slice(2, 8)}@example.test`).toLowerCase()
  let { rows } = await pool.query(`SELECT id FROM users WHERE email = $1`, [address])
  if (rows.length === 0) {
    ({ rows } = await pool.query(`INSERT INTO users (email, name, password_hash) VALUES ($1, $2, $3) RETURNING id`, [address, `Test ${role}`, await testPasswordHash()]))
  }
  const membership = await pool.query(`INSERT INTO memberships (organisation_id, user_id, role) VALUES ($1, $2, $3) RETURNING id`, [organisationId, rows[0].id, role])
  return { userId: rows[0].id, email: address, membershipId: membership.rows[0].id }
}

/** A fetch client that keeps the session cookie. */
export class Client {
  cookie = ''
  /** An API token sent as `Authorization: Bearer`; a client with one keeps no cookie (a script's). */
  bearer = ''
  constructor(readonly baseUrl: string = inject('baseUrl')) {}

  async request(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<Response> {
    const isForm = body instanceof FormData
    const res = await fetch(`${this.baseUrl}${path}`, {
      method,
      headers: { ...(this.cookie ? { cookie: this.cookie } : {}), ...(this.bearer ? { authorization: `Bearer ${this.bearer}` } : {}), ...(body !== undefined && !isForm ? { 'content-type': 'application/json' } : {}), ...headers },
      body: body === undefined ? undefined : isForm ? body : JSON.stringify(body),
      redirect: 'manual',
    })
    const setCookie = this.bearer ? [] : res.headers.getSetCookie()
    for (const c of setCookie) {
      const pair = c.split(';')[0]!
      if (pair.startsWith('nuxt-session=')) this.cookie = pair.endsWith('=') ? '' : pair
    }
    return res
  }

  get = (path: string) => this.request('GET', path)
  post = (path: string, body?: unknown) => this.request('POST', path, body ?? {})
  patch = (path: string, body?: unknown) => this.request('PATCH', path, body ?? {})
  delete = (path: string) => this.request('DELETE', path)

  async signIn(email: string, password = TEST_PASSWORD): Promise<Response> {
    return this.post('/api/auth/sign-in', { email, password })
  }
}

/** A client that calls with an API token and no session. */
export function bearerClient(token: string): Client {
  const client = new Client()
  client.bearer = token
  return client
}

/**
 * Writes an API token for a member straight into the database (as POST /api/auth/tokens would:
 * `slk_` + 32 random bytes, SHA-256 stored) and returns the secret. `state` makes it revoked or
 * expired (its expiry a minute ago).
 */
export async function insertApiToken(pool: pg.Pool, userId: string, organisationId: string, options: { readOnly?: boolean, state?: 'open' | 'revoked' | 'expired', name?: string } = {}): Promise<{ id: string, secret: string }> {
  const secret = `slk_${randomBytes(32).toString('base64url')}`
  const hash = createHash('sha256').update(secret).digest('hex')
  const state = options.state ?? 'open'
  const { rows } = await pool.query(
    `INSERT INTO api_tokens (user_id, organisation_id, name, token_hash, last_four, read_only, session_version, expires_at, revoked_at)
     SELECT $1, $2, $3, $4, $5, $6, u.session_version, CASE WHEN $7 = 'expired' THEN now() - interval '1 minute' ELSE now() + interval '30 days' END, CASE WHEN $7 = 'revoked' THEN now() END
     FROM users u WHERE u.id = $1 RETURNING id`,
    [userId, organisationId, options.name ?? 'test token', hash, secret.slice(-4), options.readOnly ?? false, state],
  )
  if (!rows[0]) throw new Error(`no user ${userId}`)
  return { id: rows[0].id, secret }
}

/** Signs in a new member of `organisationId` with `role` and returns their client. */
export async function memberClient(pool: pg.Pool, organisationId: string, role: RoleName): Promise<Client> {
  const { email } = await createMember(pool, organisationId, role)
  const client = new Client()
  const res = await client.signIn(email)
  if (res.status !== 200) throw new Error(`sign-in failed for ${email}: ${res.status} ${await res.text()}`)
  return client
}
