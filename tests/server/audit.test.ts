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

describe('GET /api/audit/export', () => {
  it('exports the filtered log as XLSX, one row per changed field with readable before and after, and audits the export', async () => {
    // A name that a spreadsheet would run as a formula (OWASP CSV-injection guidance).
    await pool.query(`INSERT INTO audit_events (organisation_id, user_id, action, entity, entity_id, before, after, at) VALUES ($1, $2, 'update', 'site', 'formula-site', $3, $4, '2025-02-01T08:00:00Z')`,
      [org, analyst.userId, JSON.stringify({ name: 'Old yard', heightM: 6 }), JSON.stringify({ name: '=HYPERLINK("http://example.invalid","x")', heightM: 7.5 })])
    const res = await admin.get('/api/audit/export?entity=site&from=2025-01-01&to=2025-12-31')
    expect(res.status).toBe(200)
    expect(res.headers.get('content-disposition')).toMatch(/attachment; filename="stormledger-audit-log-\d{4}-\d{2}-\d{2}\.xlsx"/)
    const ExcelJS = (await import('exceljs')).default
    const wb = new ExcelJS.Workbook()
    await wb.xlsx.load(Buffer.from(await res.arrayBuffer()) as unknown as ArrayBuffer)
    const sheet = wb.getWorksheet('Audit log')!
    const header = (sheet.getRow(1).values as unknown[]).slice(1)
    expect(header).toEqual(['Time (UTC)', 'Person', 'E-mail', 'Action', 'Entity', 'Entity id', 'Field', 'Before', 'After', 'Client address', 'Via', 'Event id'])
    const rows = [] as unknown[][]
    sheet.eachRow((r, n) => { if (n > 1) rows.push((r.values as unknown[]).slice(1, 10)) })
    // Only the two site events of 2025 (the filters), newest first; the update has two changed fields.
    expect(rows).toEqual([
      ['2025-02-01T08:00:00.000Z', 'Test analyst', analyst.email, 'update', 'site', 'formula-site', 'name', 'Old yard', '\'=HYPERLINK("http://example.invalid","x")'],
      ['2025-02-01T08:00:00.000Z', 'Test analyst', analyst.email, 'update', 'site', 'formula-site', 'heightM', '6', '7.5'],
      ['2025-01-15T12:00:00.000Z', 'Test analyst', analyst.email, 'update', 'site', 'old-site', undefined, undefined, undefined],
    ].map(r => r.map(v => v ?? undefined)))
    const about = wb.getWorksheet('About')!
    const aboutRows = new Map<string, unknown>()
    about.eachRow(r => aboutRows.set(String(r.getCell(1).value), r.getCell(2).value))
    expect(aboutRows.get('Entity')).toBe('site') // the filters the file was made with
    expect(aboutRows.get('From (UTC day)')).toBe('2025-01-01')
    expect(aboutRows.get('Events, count')).toBe(2)

    const csv = await admin.get('/api/audit/export?format=csv&entity=site&from=2025-02-01&to=2025-02-01')
    expect(csv.status).toBe(200)
    const lines = (await csv.text()).trim().split(/\r?\n/)
    expect(lines[0]).toBe('Time (UTC),Person,E-mail,Action,Entity,Entity id,Field,Before,After,Client address,Via,Event id')
    expect(lines).toHaveLength(3) // the header and the two changed fields of the one event that day
    expect(lines[1]).toContain('\'=HYPERLINK') // formula-safe in CSV too

    const { rows: audited } = await pool.query(`SELECT after FROM audit_events WHERE organisation_id = $1 AND action = 'export' AND entity = 'audit_log' ORDER BY at`, [org])
    expect(audited.map(r => r.after.format)).toEqual(['xlsx', 'csv'])
    expect(audited[0].after).toMatchObject({ entity: 'site', from: '2025-01-01', to: '2025-12-31', events: 2 })
  })

  it('refuses a format it does not write, beside the field', async () => {
    const res = await admin.get('/api/audit/export?format=pdf')
    expect(res.status).toBe(400)
    expect((await res.json()).data.fields.format).toBe('Choose xlsx or csv.')
  })
})
