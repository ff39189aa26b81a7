// Mail belongs to whoever sent it or to the person it was sent to: an organisation's Mailbox shows
// only the mail that organisation sent; password mail belongs to the person alone (My mail). The
// attack this guards against: an admin of A invites a member of B, asks for a password reset for that
// address, and reads the reset link in A's Mailbox.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, TEST_PASSWORD, createMember, createOrganisation, memberClient } from '../support/accounts'
import { testPool } from '../support/db'
import { linkIn, waitForMail } from '../support/mail'

const pool = testPool()
afterAll(() => pool.end())

interface Message { to: string, subject: string, body: string }
const messages = async (client: Client, path: string): Promise<Message[]> => {
  const res = await client.get(path)
  expect(res.status).toBe(200)
  return (await res.json()).messages
}

let orgA: string
let orgB: string
let adminA: Client
let adminB: Client
let victim: { email: string, userId: string }

beforeAll(async () => {
  orgA = await createOrganisation(pool, 'Attacker Brokerage', 'broker')
  orgB = await createOrganisation(pool, 'Victim Operating', 'operator')
  adminA = await memberClient(pool, orgA, 'admin')
  adminB = await memberClient(pool, orgB, 'admin')
  victim = await createMember(pool, orgB, 'analyst')
})

describe('the mailbox attack', () => {
  it('fails at every step', async () => {
    // Step 1: A invites B's member. That invitation is A's own mail, and shows in A's Mailbox.
    const invitedAt = new Date()
    expect((await adminA.post('/api/invitations', { email: victim.email, role: 'viewer' })).status).toBe(201)
    const invitation = await waitForMail(pool, victim.email, invitedAt)
    const invitationToken = linkIn(invitation.body, '/invitations/').token
    expect((await messages(adminA, '/api/mailbox')).map(m => m.subject)).toEqual([invitation.subject])

    // Step 2: A asks for a reset of the victim's password. The link is mailed to the victim only.
    const requestedAt = new Date()
    expect((await new Client().post('/api/auth/reset-password', { email: victim.email })).status).toBe(200)
    const reset = await waitForMail(pool, victim.email, requestedAt)
    expect(reset.body).toContain('/reset-password/')
    const { rows } = await pool.query(`SELECT organisation_id FROM captured_mail WHERE text_body = $1`, [reset.body])
    expect(rows.map(r => r.organisation_id)).toEqual([null]) // personal mail carries no organisation

    // Step 3: A's Mailbox does not show it — nor does B's: it is the person's, not an organisation's.
    for (const admin of [adminA, adminB]) {
      const seen = await messages(admin, '/api/mailbox')
      expect(seen.some(m => m.body.includes('/reset-password/'))).toBe(false)
    }
    expect(await messages(adminA, '/api/mailbox')).toHaveLength(1)

    // Step 4: the invitation cannot add the victim's account to A without the victim.
    expect((await new Client().post(`/api/invitations/accept/${invitationToken}`, {})).status).toBe(401)
    expect((await adminA.post(`/api/invitations/accept/${invitationToken}`, {})).status).toBe(403)
    const joined = await pool.query(`SELECT 1 FROM memberships WHERE organisation_id = $1 AND user_id = $2`, [orgA, victim.userId])
    expect(joined.rows).toEqual([])

    // Step 5: A's admin's own My mail holds nothing of the victim's.
    expect((await messages(adminA, '/api/my-mail')).some(m => m.to.includes(victim.email))).toBe(false)

    // The victim reads both messages under My mail.
    const person = new Client()
    expect((await person.signIn(victim.email, TEST_PASSWORD)).status).toBe(200)
    const mine = (await messages(person, '/api/my-mail')).map(m => m.subject)
    expect(mine).toContain(invitation.subject)
    expect(mine).toContain(reset.subject)
  })

  it('never shows an organisation the mail another organisation sent to the same address', async () => {
    const address = 'shared.prospect@example.test'
    const since = new Date()
    expect((await adminB.post('/api/invitations', { email: address, role: 'analyst' })).status).toBe(201)
    await waitForMail(pool, address, since)
    const seenByA = await messages(adminA, '/api/mailbox')
    expect(seenByA.some(m => m.to === address)).toBe(false)
    expect((await messages(adminB, '/api/mailbox')).some(m => m.to === address && m.subject.includes('Victim Operating'))).toBe(true)
  })

  it('keeps the password-changed notice out of every Mailbox', async () => {
    const person = new Client()
    expect((await person.signIn(victim.email, TEST_PASSWORD)).status).toBe(200)
    const since = new Date()
    expect((await person.post('/api/auth/change-password', { currentPassword: TEST_PASSWORD, newPassword: 'a fresh passphrase for B' })).status).toBe(200)
    const notice = await waitForMail(pool, victim.email, since)
    expect(notice.subject).toMatch(/password was changed/)
    for (const admin of [adminA, adminB]) {
      expect((await messages(admin, '/api/mailbox')).some(m => m.subject === notice.subject)).toBe(false)
    }
    expect((await messages(person, '/api/my-mail')).some(m => m.subject === notice.subject)).toBe(true)
  })
})
