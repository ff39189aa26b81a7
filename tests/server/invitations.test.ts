// Invitations: an admin invites an address with a role; the e-mailed link works once, for 7 days;
// accepting creates the account or adds the membership to an existing one.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, TEST_PASSWORD, createMember, createOrganisation, memberClient } from '../support/accounts'
import { testPool } from '../support/db'
import { linkIn, waitForMail } from '../support/mail'

const pool = testPool()
afterAll(() => pool.end())

let org: string
let admin: Client

beforeAll(async () => {
  org = await createOrganisation(pool, 'Invitation Insurer', 'insurer')
  admin = await memberClient(pool, org, 'admin')
})

async function invite(email: string, role: string, by = admin): Promise<{ id: string, token: string, body: string }> {
  const since = new Date()
  const res = await by.post('/api/invitations', { email, role })
  expect(res.status).toBe(201)
  const { invitation } = await res.json()
  const mail = await waitForMail(pool, email, since)
  return { id: invitation.id, token: linkIn(mail.body, '/invitations/').token, body: mail.body }
}

describe('invitations', () => {
  it('creates an account from the e-mailed link, once, with the invited role', async () => {
    const { token, body } = await invite('New.Analyst@Example.test', 'analyst')
    expect(body).toContain('Invitation Insurer')
    expect(body).toContain('analyst')
    const info = await new Client().get(`/api/invitations/accept/${token}`)
    expect(info.status).toBe(200)
    expect(await info.json()).toMatchObject({ email: 'new.analyst@example.test', role: 'analyst', organisationName: 'Invitation Insurer', accountExists: false })

    expect((await new Client().post(`/api/invitations/accept/${token}`, { name: 'Ana Lyst' })).status).toBe(400)
    expect((await new Client().post(`/api/invitations/accept/${token}`, { name: 'Ana Lyst', password: 'too short' })).status).toBe(400)
    expect((await new Client().post(`/api/invitations/accept/${token}`, { name: 'Ana Lyst', password: 'new.analyst@example.test' })).status).toBe(400)
    const newcomer = new Client()
    const accepted = await newcomer.post(`/api/invitations/accept/${token}`, { name: 'Ana Lyst', password: 'lightning over the tank farm' })
    expect(accepted.status).toBe(200)
    // The new person is signed in by accepting, in the organisation just joined (issue "Screens a practitioner reads at a glance").
    expect(await accepted.json()).toMatchObject({ signedIn: true, accountCreated: true })
    expect(await (await newcomer.get('/api/_auth/session')).json()).toMatchObject({ role: 'analyst' })

    const client = new Client()
    const signIn = await client.signIn('new.analyst@example.test', 'lightning over the tank farm')
    expect(signIn.status).toBe(200)
    expect((await signIn.json()).role).toBe('analyst')
    expect((await client.get('/api/members')).status).toBe(403)

    // Single use.
    expect((await new Client().get(`/api/invitations/accept/${token}`)).status).toBe(410)
    expect((await new Client().post(`/api/invitations/accept/${token}`, { name: 'Again', password: 'lightning over the tank farm' })).status).toBe(410)
    const listed = await (await admin.get('/api/invitations')).json()
    expect(listed.invitations.find((i: { email: string }) => i.email === 'new.analyst@example.test').status).toBe('accepted')
  })

  it('expires after 7 days', async () => {
    const { id, token } = await invite('late.comer@example.test', 'viewer')
    const { rows } = await pool.query(`SELECT extract(epoch FROM expires_at - created_at) AS s FROM invitations WHERE id = $1`, [id])
    expect(Number(rows[0].s)).toBeCloseTo(7 * 86400, -1) // the rule: 7 days
    await pool.query(`UPDATE invitations SET expires_at = now() - interval '1 second' WHERE id = $1`, [id])
    expect((await new Client().get(`/api/invitations/accept/${token}`)).status).toBe(410)
    expect((await new Client().post(`/api/invitations/accept/${token}`, { name: 'Late', password: 'lightning over the tank farm' })).status).toBe(410)
  })

  it('adds the membership to an existing account, whose next sign-in lands in the new organisation', async () => {
    const home = await createOrganisation(pool, 'Existing Home Operator')
    const { email } = await createMember(pool, home, 'admin', 'multi.org@example.test')
    const { token } = await invite(email, 'underwriter')
    expect((await (await new Client().get(`/api/invitations/accept/${token}`)).json()).accountExists).toBe(true)
    const memberships = async () => Number((await pool.query(`SELECT count(*)::int AS n FROM memberships m JOIN users u ON u.id = m.user_id WHERE u.email = $1`, [email])).rows[0].n)

    // Without the person's consent nothing happens: no session, someone else's session, a wrong password.
    const anonymous = await new Client().post(`/api/invitations/accept/${token}`, {})
    expect(anonymous.status).toBe(401)
    const somebodyElse = await memberClient(pool, home, 'viewer')
    expect((await (await somebodyElse.get(`/api/invitations/accept/${token}`)).json()).signedInAsOther).toBe(true)
    expect((await somebodyElse.post(`/api/invitations/accept/${token}`, {})).status).toBe(403)
    expect((await new Client().post(`/api/invitations/accept/${token}`, { currentPassword: 'not the password at all' })).status).toBe(401)
    expect(await memberships()).toBe(1)

    // With the account's password the page signs the person in and accepts, in the new organisation.
    const client = new Client()
    const accepted = await client.post(`/api/invitations/accept/${token}`, { currentPassword: TEST_PASSWORD })
    expect(accepted.status).toBe(200)
    expect(await accepted.json()).toMatchObject({ signedIn: true, accountCreated: false })
    expect(await memberships()).toBe(2)
    expect(await (await client.get('/api/_auth/session')).json()).toMatchObject({ organisationId: org, role: 'underwriter' })
    await pool.query(`DELETE FROM sign_in_attempts`) // this file's failed attempts must not throttle later tests

    const signIn = await (await new Client().signIn(email)).json()
    expect(signIn).toMatchObject({ organisationId: org, role: 'underwriter' })
    const session = await (await client.get('/api/_auth/session')).json()
    expect(session.memberships.map((m: { organisationName: string, role: string }) => `${m.organisationName}:${m.role}`).sort())
      .toEqual(['Existing Home Operator:admin', 'Invitation Insurer:underwriter'])

    // Switching organisation changes the role that the guard sees.
    expect((await client.get('/api/members')).status).toBe(403)
    expect((await client.post('/api/auth/switch-organisation', { organisationId: home })).status).toBe(200)
    expect((await client.get('/api/members')).status).toBe(200)
    // An organisation one does not belong to: 404.
    const stranger = await createOrganisation(pool, 'Stranger Broker', 'broker')
    expect((await client.post('/api/auth/switch-organisation', { organisationId: stranger })).status).toBe(404)
  })

  it('adds an existing account that is signed in as the invited address with one click', async () => {
    const elsewhere = await createOrganisation(pool, 'Consent Broker', 'broker')
    const elsewhereAdmin = await memberClient(pool, elsewhere, 'admin')
    const home = await createOrganisation(pool, 'Consent Home Operator')
    const { email } = await createMember(pool, home, 'analyst')
    const person = new Client()
    expect((await person.signIn(email)).status).toBe(200)
    const { token } = await invite(email, 'viewer', elsewhereAdmin)
    expect((await (await person.get(`/api/invitations/accept/${token}`)).json()).signedInAsInvitee).toBe(true)
    const accepted = await person.post(`/api/invitations/accept/${token}`, {})
    expect(accepted.status).toBe(200)
    // The same session carries on, now in the organisation just joined.
    expect(await (await person.get('/api/_auth/session')).json()).toMatchObject({ organisationId: elsewhere, role: 'viewer' })
  })

  it('creates a new account while somebody else is signed in without touching their session', async () => {
    const bystander = await memberClient(pool, org, 'viewer')
    const before = await (await bystander.get('/api/_auth/session')).json()
    const { token } = await invite('fresh.colleague@example.test', 'analyst')
    expect((await (await bystander.get(`/api/invitations/accept/${token}`)).json()).signedInAsOther).toBe(false)
    const res = await bystander.post(`/api/invitations/accept/${token}`, { name: 'Fresh Colleague', password: 'storm season passphrase' })
    expect(res.status).toBe(200)
    expect((await res.json()).signedIn).toBe(false)
    expect((await (await bystander.get('/api/_auth/session')).json()).user).toEqual(before.user)
  })

  it('refuses to invite an existing member, replaces an open invitation, and can withdraw or resend one', async () => {
    const { email } = await createMember(pool, org, 'viewer')
    expect((await admin.post('/api/invitations', { email, role: 'analyst' })).status).toBe(409)

    const first = await invite('twice@example.test', 'viewer')
    const second = await invite('twice@example.test', 'analyst')
    expect((await new Client().get(`/api/invitations/accept/${first.token}`)).status).toBe(410)
    expect((await new Client().get(`/api/invitations/accept/${second.token}`)).status).toBe(200)

    expect((await admin.delete(`/api/invitations/${second.id}`)).status).toBe(200)
    expect((await new Client().get(`/api/invitations/accept/${second.token}`)).status).toBe(410)

    const since = new Date()
    expect((await admin.post(`/api/invitations/${second.id}/resend`)).status).toBe(200)
    const fresh = linkIn((await waitForMail(pool, 'twice@example.test', since)).body, '/invitations/').token
    expect(fresh).not.toBe(second.token)
    expect((await new Client().get(`/api/invitations/accept/${second.token}`)).status).toBe(404)
    expect((await new Client().get(`/api/invitations/accept/${fresh}`)).status).toBe(200)
  })

  it('records invitations and acceptances in the audit log', async () => {
    const { rows } = await pool.query(`SELECT action, entity, after FROM audit_events WHERE organisation_id = $1 AND action IN ('invite', 'accept_invitation', 'revoke', 'resend') ORDER BY at`, [org])
    expect(rows.map(r => r.action)).toEqual(['invite', 'accept_invitation', 'invite', 'invite', 'accept_invitation', 'invite', 'accept_invitation', 'invite', 'invite', 'revoke', 'resend'])
    expect(rows[0].after).toEqual({ email: 'new.analyst@example.test', role: 'analyst' })
  })

  it('shows the caught messages in the Mailbox of the inviting organisation only', async () => {
    const mailbox = await (await admin.get('/api/mailbox')).json()
    expect(mailbox.enabled).toBe(true)
    expect(mailbox.messages.some((m: { to: string, subject: string }) => m.to === 'twice@example.test' && m.subject.includes('Invitation Insurer'))).toBe(true)
    const otherOrg = await createOrganisation(pool, 'Nosy Operator')
    const otherAdmin = await memberClient(pool, otherOrg, 'admin')
    const theirs = await (await otherAdmin.get('/api/mailbox')).json()
    expect(theirs.messages).toEqual([])
  })
})
