// Referrals: status, assignee, due date and a thread; the assignee is e-mailed; the organisation's
// open referrals in one list; who may change what; every change audited.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, createMember, createOrganisation, memberClient } from '../support/accounts'
import { testPool } from '../support/db'
import { mailTo, waitForMail } from '../support/mail'

const pool = testPool()
afterAll(() => pool.end())

interface Referral { id: string, status: string, assignee: { id: string, name: string } | null, dueOn: string | null, siteName: string, replies: { body: string, author: string }[] }

let org: string
let siteId: string
let underwriter: Client
let viewer: Client
let assignee: { client: Client, userId: string, email: string }
let bystander: Client
let bystanderUser: { userId: string, email: string }

beforeAll(async () => {
  org = await createOrganisation(pool, 'Referral Test Insurer', 'insurer')
  const { rows: [site] } = await pool.query(
    `INSERT INTO sites (organisation_id, external_id, name, latitude_deg, longitude_deg, flash_density_per_km2_yr) VALUES ($1, 'REF-1', 'Harrowgate Flats', 32, -102, 4) RETURNING id`, [org])
  siteId = site.id
  underwriter = await memberClient(pool, org, 'underwriter')
  viewer = await memberClient(pool, org, 'viewer')
  bystanderUser = await createMember(pool, org, 'analyst')
  bystander = new Client()
  expect((await bystander.signIn(bystanderUser.email)).status).toBe(200)
  const a = await createMember(pool, org, 'asset_manager')
  const client = new Client()
  expect((await client.signIn(a.email)).status).toBe(200)
  assignee = { client, userId: a.userId, email: a.email }
})

describe('referrals', () => {
  let referral: Referral

  it('an underwriter gives a referral to a member with a due date; the member is e-mailed with a link to it', async () => {
    const since = new Date()
    const res = await underwriter.post(`/api/sites/${siteId}/notes`, { body: 'Refer: no shields on the condensate tanks.\nAsk for the bonding survey.', assigneeId: assignee.userId, dueOn: '2027-01-15' })
    expect(res.status).toBe(201)
    referral = await res.json()
    expect(referral).toMatchObject({ status: 'open', dueOn: '2027-01-15', assignee: { id: assignee.userId } })
    const mail = await waitForMail(pool, assignee.email, since)
    expect(mail.subject).toBe('Referral for you: Harrowgate Flats, due 2027-01-15')
    expect(mail.body).toContain('> Ask for the bonding survey.')
    expect(mail.body).toContain(`/referrals?note=${referral.id}`)
  })

  it('refuses an assignee outside the organisation and a date that is not one, beside the field', async () => {
    const otherOrg = await createOrganisation(pool, 'Referral Other Org')
    const stranger = await createMember(pool, otherOrg, 'analyst')
    const res = await underwriter.post(`/api/sites/${siteId}/notes`, { body: 'x', assigneeId: stranger.userId })
    expect(res.status).toBe(400)
    expect((await res.json()).data.fields).toEqual({ assigneeId: 'Choose a member of your organisation.' })
    const bad = await underwriter.post(`/api/sites/${siteId}/notes`, { body: 'x', dueOn: '2027-02-30' })
    expect(bad.status).toBe(400)
    expect((await bad.json()).data.fields.dueOn).toBe('Enter a date as YYYY-MM-DD.')
  })

  it('the assignee moves the status and replies; others but underwriters may not change it; viewers may not reply', async () => {
    const moved = await assignee.client.patch(`/api/referrals/${referral.id}`, { status: 'in_review' })
    expect(moved.status).toBe(200)
    expect((await moved.json()).status).toBe('in_review')
    expect((await assignee.client.patch(`/api/referrals/${referral.id}`, { dueOn: '2027-03-01' })).status).toBe(403) // the due date is the underwriter's
    expect((await bystander.patch(`/api/referrals/${referral.id}`, { status: 'accepted' })).status).toBe(403) // not assigned to them
    expect((await assignee.client.post(`/api/referrals/${referral.id}/replies`, { body: 'Survey booked for next week.' })).status).toBe(201)
    expect((await underwriter.post(`/api/referrals/${referral.id}/replies`, { body: 'Thanks — send it when it is in.' })).status).toBe(201)
    expect((await viewer.post(`/api/referrals/${referral.id}/replies`, { body: 'no' })).status).toBe(403)
    const [onSite] = await (await viewer.get(`/api/sites/${siteId}/notes`)).json() as Referral[]
    expect(onSite!.replies.map(r => r.body)).toEqual(['Survey booked for next week.', 'Thanks — send it when it is in.']) // oldest first
  })

  it('lists the organisation\'s open referrals (open and in review), assigned-to-me, and closed ones apart', async () => {
    const open = await (await viewer.get('/api/referrals')).json() as Referral[]
    expect(open.map(r => r.id)).toContain(referral.id)
    expect(open[0]!.siteName).toBe('Harrowgate Flats')
    const mine = await (await assignee.client.get('/api/referrals?mine=true')).json() as Referral[]
    expect(mine.map(r => r.id)).toEqual([referral.id])
    expect(await (await bystander.get('/api/referrals?mine=true')).json()).toEqual([])
    expect((await underwriter.patch(`/api/referrals/${referral.id}`, { status: 'accepted', dueOn: null })).status).toBe(200)
    expect((await (await viewer.get('/api/referrals')).json() as Referral[]).map(r => r.id)).not.toContain(referral.id)
    expect((await (await viewer.get('/api/referrals?state=closed')).json() as Referral[]).map(r => r.id)).toContain(referral.id)
  })

  it('audits every change with readable before and after', async () => {
    const { rows } = await pool.query(`SELECT action, entity, before, after FROM audit_events WHERE organisation_id = $1 AND entity IN ('site_note', 'site_note_reply') ORDER BY at`, [org])
    expect(rows.map(r => `${r.action} ${r.entity}`)).toEqual(['create site_note', 'update site_note', 'create site_note_reply', 'create site_note_reply', 'update site_note'])
    expect(rows[1]).toMatchObject({ before: { status: 'Open' }, after: { status: 'In review' } })
    expect(rows[4]).toMatchObject({ before: { status: 'In review', dueOn: '2027-01-15' }, after: { status: 'Accepted', dueOn: null } })
  })

  it('another organisation sees none of them', async () => {
    const other = await createOrganisation(pool, 'Referral Outsider')
    const outsider = await memberClient(pool, other, 'underwriter')
    expect(await (await outsider.get('/api/referrals?state=all')).json()).toEqual([])
    expect((await outsider.patch(`/api/referrals/${referral.id}`, { status: 'declined' })).status).toBe(404)
  })

  it('mails the new assignee when a referral changes hands, and nobody again for a status change', async () => {
    const since = new Date()
    expect((await underwriter.patch(`/api/referrals/${referral.id}`, { assigneeId: bystanderUser.userId })).status).toBe(200)
    const mail = await waitForMail(pool, bystanderUser.email, since)
    expect(mail.subject).toBe('Referral for you: Harrowgate Flats')
    // The same assignee sent again with a status change: no second mail.
    expect((await underwriter.patch(`/api/referrals/${referral.id}`, { assigneeId: bystanderUser.userId, status: 'declined' })).status).toBe(200)
    await new Promise(r => setTimeout(r, 3000)) // the mail worker delivers within a second or two (mail.send polls every second)
    expect((await mailTo(pool, bystanderUser.email)).filter(m => m.subject.startsWith('Referral for you'))).toHaveLength(1)
  })
})
