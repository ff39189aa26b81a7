// The audit log for admins: the organisation's own events and its members' account events, filtered
// by person, entity and date; nothing of other organisations.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, createMember, createOrganisation, memberClient } from '../support/accounts'
import { testPool } from '../support/db'

const pool = testPool()
afterAll(() => pool.end())

let org: string
let admin: Client
let analyst: { userId: string, email: string, membershipId: string }

beforeAll(async () => {
  org = await createOrganisation(pool, 'Audit Insurer', 'insurer')
  admin = await memberClient(pool, org, 'admin')
  analyst = await createMember(pool, org, 'analyst')
  await new Client().signIn(analyst.email, 'a wrong password for the log')
  await new Client().signIn(analyst.email)
  await admin.patch(`/api/members/${analyst.membershipId}`, { role: 'viewer' })
  const other = await createOrganisation(pool, 'Audit Other Operator')
  await memberClient(pool, other, 'admin') // signs in: an event of the other organisation
  // An event dated last year, for the date filter.
  await pool.query(`INSERT INTO audit_events (organisation_id, user_id, action, entity, entity_id, at) VALUES ($1, $2, 'update', 'site', 'old-site', '2025-01-15T12:00:00Z')`, [org, analyst.userId])
})

const get = async (query: string) => {
  const res = await admin.get(`/api/audit${query}`)
  expect(res.status).toBe(200)
  return res.json() as Promise<{ events: { action: string, entity: string, person: { email: string } | null, before: unknown, after: unknown }[], total: number, people: { id: string }[], entities: string[] }>
}

describe('GET /api/audit', () => {
  it('lists sign-ins, failed sign-ins and role changes of the organisation, newest first', async () => {
    const log = await get('')
    const actions = log.events.map(e => `${e.action}:${e.person?.email ?? '-'}`)
    expect(actions).toContain(`sign_in_failed:${analyst.email}`)
    expect(actions).toContain(`sign_in:${analyst.email}`)
    expect(log.events.find(e => e.action === 'role_change')).toMatchObject({ entity: 'membership', before: { role: 'analyst' }, after: { role: 'viewer' } })
    expect(log.events.every(e => e.person === null || !e.person.email.startsWith('admin.') || actions.length > 0)).toBe(true)
    // The other organisation's sign-in is not there: only two people appear.
    expect(log.people).toHaveLength(2)
  })

  it('filters by person, entity and date', async () => {
    const byPerson = await get(`?person=${analyst.userId}`)
    expect(byPerson.events.every(e => e.person?.email === analyst.email)).toBe(true)
    expect(byPerson.total).toBe(3) // failed sign-in, sign-in, the old site update
    const byEntity = await get('?entity=membership')
    expect(byEntity.events.map(e => e.action)).toEqual(['role_change'])
    const lastYear = await get('?from=2025-01-01&to=2025-01-31')
    expect(lastYear.events.map(e => `${e.action} ${e.entity}`)).toEqual(['update site'])
    const oneDay = await get('?from=2025-01-15&to=2025-01-15')
    expect(oneDay.total).toBe(1)
    expect((await admin.get('/api/audit?from=yesterday')).status).toBe(400)
  })
})
