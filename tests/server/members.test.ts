// Members: roles change at once, removal, and never without an admin.
import { afterAll, describe, expect, it } from 'vitest'
import { Client, createMember, createOrganisation, memberClient } from '../support/accounts'
import { testPool } from '../support/db'

const pool = testPool()
afterAll(() => pool.end())

describe('members', () => {
  it('lists members, changes a role with effect on the next request, and audits before and after', async () => {
    const org = await createOrganisation(pool, 'Members Operator')
    const admin = await memberClient(pool, org, 'admin')
    const { email, membershipId } = await createMember(pool, org, 'analyst')
    const analyst = new Client()
    await analyst.signIn(email)
    expect((await analyst.get('/api/members')).status).toBe(403)

    const list = await (await admin.get('/api/members')).json()
    expect(list.members.map((m: { role: string }) => m.role).sort()).toEqual(['admin', 'analyst'])

    expect((await admin.patch(`/api/members/${membershipId}`, { role: 'admin' })).status).toBe(200)
    expect((await analyst.get('/api/members')).status).toBe(200) // same session, new role
    expect((await (await analyst.get('/api/_auth/session')).json()).role).toBe('admin')

    const { rows } = await pool.query(`SELECT before, after FROM audit_events WHERE action = 'role_change' AND entity_id = $1`, [membershipId])
    expect(rows).toEqual([{ before: { email, role: 'analyst' }, after: { email, role: 'admin' } }])
  })

  it('never demotes or removes the last admin, and a removed member loses access at once', async () => {
    const org = await createOrganisation(pool, 'Last Admin Operator')
    const { email: adminEmail, membershipId: adminMembership } = await createMember(pool, org, 'admin')
    const admin = new Client()
    await admin.signIn(adminEmail)
    const demote = await admin.patch(`/api/members/${adminMembership}`, { role: 'viewer' })
    expect(demote.status).toBe(409)
    expect((await demote.json()).statusMessage).toMatch(/at least one admin/)
    expect((await admin.delete(`/api/members/${adminMembership}`)).status).toBe(409)

    const { email: secondEmail, membershipId: secondMembership } = await createMember(pool, org, 'admin')
    const second = new Client()
    await second.signIn(secondEmail)
    expect((await admin.delete(`/api/members/${secondMembership}`)).status).toBe(200)
    expect((await second.get('/api/_auth/session')).status).toBe(401)
    const { rows } = await pool.query(`SELECT before FROM audit_events WHERE action = 'delete' AND entity = 'membership' AND entity_id = $1`, [secondMembership])
    expect(rows[0].before).toMatchObject({ email: secondEmail, role: 'admin' })
    // The account itself stays.
    expect((await pool.query(`SELECT 1 FROM users WHERE email = $1`, [secondEmail])).rowCount).toBe(1)
  })

  it('answers 404 for a membership of another organisation and leaves it untouched', async () => {
    const mine = await createOrganisation(pool, 'Prober Insurer', 'insurer')
    const theirs = await createOrganisation(pool, 'Probed Operator')
    const admin = await memberClient(pool, mine, 'admin')
    const { membershipId } = await createMember(pool, theirs, 'admin')
    expect((await admin.patch(`/api/members/${membershipId}`, { role: 'viewer' })).status).toBe(404)
    expect((await admin.delete(`/api/members/${membershipId}`)).status).toBe(404)
    expect((await pool.query(`SELECT role FROM memberships WHERE id = $1`, [membershipId])).rows).toEqual([{ role: 'admin' }])
  })
})
