// Cross-site request forgery: a cookie-carrying request that a browser marks as coming from another
// origin is refused before any handler runs, and JSON routes take only JSON bodies, so an HTML form
// on another site (or another port of this host) cannot invite an admin. Clients that send neither
// Origin nor Sec-Fetch-Site (scripts, these tests) keep working.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Client} from '../support/accounts';
import { createOrganisation, memberClient } from '../support/accounts'
import { testPool } from '../support/db'

const pool = testPool()
afterAll(() => pool.end())

let org: string
let admin: Client
const invitationsFor = async (email: string) => Number((await pool.query(`SELECT count(*)::int AS n FROM invitations WHERE organisation_id = $1 AND email = $2`, [org, email])).rows[0].n)

beforeAll(async () => {
  org = await createOrganisation(pool, 'Forgery Target Insurer', 'insurer')
  admin = await memberClient(pool, org, 'admin')
})

describe('state-changing requests from another origin', () => {
  it('refuses a forged Origin (another port of the same host) and writes nothing', async () => {
    const base = new URL(inject('baseUrl'))
    const forged = `${base.protocol}//${base.hostname}:${Number(base.port) + 1}`
    const res = await admin.request('POST', '/api/invitations', { email: 'forged.admin@example.test', role: 'admin' }, { origin: forged })
    expect(res.status).toBe(403)
    expect(await invitationsFor('forged.admin@example.test')).toBe(0)
    expect((await admin.request('POST', '/api/invitations', { email: 'forged.admin@example.test', role: 'admin' }, { origin: 'null' })).status).toBe(403)
    expect((await admin.request('DELETE', '/api/members/00000000-0000-0000-0000-000000000000', undefined, { origin: 'http://evil.example' })).status).toBe(403)
  })

  it('refuses what the browser marks as cross-site or same-site, and accepts same-origin', async () => {
    for (const site of ['cross-site', 'same-site']) {
      const res = await admin.request('POST', '/api/invitations', { email: 'marked.site@example.test', role: 'viewer' }, { 'sec-fetch-site': site })
      expect(res.status, site).toBe(403)
    }
    expect(await invitationsFor('marked.site@example.test')).toBe(0)
    const own = await admin.request('POST', '/api/invitations', { email: 'marked.site@example.test', role: 'viewer' }, { origin: inject('baseUrl'), 'sec-fetch-site': 'same-origin' })
    expect(own.status).toBe(201)
  })

  it('refuses a form-encoded POST carrying the session cookie, and a text/plain one', async () => {
    const form = await fetch(`${inject('baseUrl')}/api/invitations`, {
      method: 'POST',
      headers: { cookie: admin.cookie, 'content-type': 'application/x-www-form-urlencoded' },
      body: 'email=form.admin%40example.test&role=admin',
    })
    expect(form.status).toBe(415)
    const plain = await fetch(`${inject('baseUrl')}/api/invitations`, {
      method: 'POST',
      headers: { cookie: admin.cookie, 'content-type': 'text/plain' },
      body: JSON.stringify({ email: 'form.admin@example.test', role: 'admin' }),
    })
    expect(plain.status).toBe(415)
    const multipart = new FormData()
    multipart.set('email', 'form.admin@example.test')
    multipart.set('role', 'admin')
    expect((await admin.request('POST', '/api/invitations', multipart)).status).toBe(415)
    expect(await invitationsFor('form.admin@example.test')).toBe(0)
  })

  it('keeps working for clients that send no Origin and no Sec-Fetch-Site, with JSON or no body', async () => {
    expect((await admin.request('POST', '/api/invitations', { email: 'script.client@example.test', role: 'viewer' })).status).toBe(201)
    const { rows } = await pool.query(`SELECT id FROM invitations WHERE email = 'script.client@example.test'`)
    expect((await admin.request('POST', `/api/invitations/${rows[0].id}/resend`)).status).toBe(200) // no body at all
  })
})
