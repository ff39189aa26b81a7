// Large inventory imports commit in the background: live progress, all or nothing when the worker
// is killed mid-import, the job worked again, the person mailed when it is done.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { SHEET_COLUMNS } from '../../shared/inventory-layout'
import { Client, createMember, createOrganisation } from '../support/accounts'
import { testPool } from '../support/db'
import { siteRow, upload } from '../support/inventory'
import { mailTo, waitForMail } from '../support/mail'
import { useTestObjectStore } from '../support/objects'
import { getObjectBuffer, putObject } from '../../server/storage/objects'

useTestObjectStore()

const pool = testPool()
afterAll(() => pool.end())

/** A Sites CSV of n rows (above the default background threshold of 2,000 rows). */
function sitesCsv(prefix: string, n: number): string {
  const headers = SHEET_COLUMNS.Sites.map(c => c.header)
  const lines = [headers.join(',')]
  for (let i = 0; i < n; i++) {
    const row = siteRow(`${prefix}-${i}`)
    lines.push(headers.map(h => String(row[h] ?? '')).join(','))
  }
  return `${lines.join('\r\n')}\r\n`
}

interface Stored { status: string, progress: { rowsTotal: number, rowsChecked: number, rowsToWrite: number, rowsWritten: number } | null, failureMessage: string | null }

const siteCount = async (org: string) => (await pool.query(`SELECT count(*)::int AS n FROM sites WHERE organisation_id = $1`, [org])).rows[0].n as number

async function waitFor(client: Client, id: string, done: (s: Stored) => boolean, timeoutMs = 120_000): Promise<Stored> {
  const started = Date.now()
  for (;;) {
    const s = await (await client.get(`/api/inventory/imports/${id}`)).json() as Stored
    if (done(s)) return s
    if (Date.now() - started > timeoutMs) throw new Error(`import ${id} still ${JSON.stringify(s)} after ${timeoutMs} ms`)
    await new Promise(r => setTimeout(r, 20))
  }
}

describe('background import', () => {
  let org: string
  let email: string
  let analyst: Client
  beforeAll(async () => {
    org = await createOrganisation(pool, 'Background Import Operator')
    ;({ email } = await createMember(pool, org, 'analyst'))
    analyst = new Client()
    expect((await analyst.signIn(email)).status).toBe(200)
  })

  it('a 2,500-row file: 202, progress up to every row, all rows written once, the person mailed', async () => {
    const since = new Date()
    const res = await upload(analyst, sitesCsv('BG', 2500), 'sites.csv', 'text/csv')
    expect(res.status).toBe(201)
    const preview = await res.json() as { id: string, summary: { rows: number } }
    expect(preview.summary.rows).toBe(2500)
    const commit = await analyst.post(`/api/inventory/imports/${preview.id}/commit`, {})
    expect(commit.status).toBe(202) // accepted, worked in the background (RFC 9110 §15.3.3)
    expect((await commit.json()).status).toBe('committing')
    expect((await analyst.post(`/api/inventory/imports/${preview.id}/commit`, {})).status).toBe(409) // one commit at a time
    const done = await waitFor(analyst, preview.id, s => s.status !== 'committing')
    expect(done.status).toBe('committed')
    expect(done.progress).toEqual({ rowsTotal: 2500, rowsChecked: 2500, rowsToWrite: 2500, rowsWritten: 2500 }) // every row of the file above is new
    expect(await siteCount(org)).toBe(2500)
    const mail = await waitForMail(pool, email, since)
    expect(mail.subject).toBe('Import of sites.csv is done')
    expect(mail.body).toMatch(/Sites: 2,500 new, 0 changed/)
    expect(mail.body).toContain(`/inventory/import?import=${preview.id}`)
    const audit = await pool.query(`SELECT action FROM audit_events WHERE entity = 'inventory_import' AND entity_id = $1 ORDER BY at`, [preview.id])
    expect(audit.rows.map(r => r.action)).toEqual(['import_queued', 'import'])
  }, 180_000)

  it('the worker killed in the middle of writing: nothing is half-written, the job is worked again and writes every row once', async () => {
    const since = new Date()
    const res = await upload(analyst, sitesCsv('KILL', 6000), 'sites-kill.csv', 'text/csv')
    const preview = await res.json() as { id: string }
    const before = await siteCount(org)
    expect((await analyst.post(`/api/inventory/imports/${preview.id}/commit`, {})).status).toBe(202)
    // Kill the worker that holds the job as soon as it has written its first chunk (of six).
    const writing = await waitFor(analyst, preview.id, s => s.status !== 'committing' || (s.progress?.rowsWritten ?? 0) > 0)
    expect(writing.status, 'the import ended before the test could kill its worker').toBe('committing')
    const { rows: [holder] } = await pool.query(
      `SELECT h.worker FROM job_heartbeats h JOIN pgboss.job j ON j.id = h.job_id WHERE j.name = 'inventory.import' AND j.data->>'importId' = $1 ORDER BY h.beat_at DESC LIMIT 1`, [preview.id])
    const pid = Number(String(holder?.worker ?? '').split(':').pop())
    expect(pid, `no heartbeat names the worker: ${JSON.stringify(holder)}`).toBeGreaterThan(0)
    process.kill(pid, 'SIGKILL') // the app's own worker: its supervisor (scripts/serve.ts) starts it again
    await new Promise(r => setTimeout(r, 300))
    // A dead worker's job is handed on only after its heartbeat goes stale (seconds): the import is still committing here.
    const midway = await waitFor(analyst, preview.id, () => true)
    expect(midway.status).toBe('committing')
    expect(await siteCount(org)).toBe(before) // the killed transaction wrote nothing that can be seen

    const done = await waitFor(analyst, preview.id, s => s.status !== 'committing', 150_000)
    expect(done.status, JSON.stringify(done)).toBe('committed')
    expect(await siteCount(org)).toBe(before + 6000) // every row once: the unique (organisation, external id) index holds either way
    await waitForMail(pool, email, since, 60_000, 'Import of sites-kill.csv is done')
    // Once each: neither this import's message nor the first test's is sent again (a killed worker
    // or a refused message in a mail batch once sent a batch's other messages a second time).
    const subjects = (await mailTo(pool, email)).map(m => m.subject)
    expect(subjects.filter(s => s === 'Import of sites-kill.csv is done')).toHaveLength(1)
    expect(subjects.filter(s => s === 'Import of sites.csv is done')).toHaveLength(1)
  }, 240_000)

  it('a commit whose re-read of the stored file finds errors fails with a message and writes nothing', async () => {
    const csv = sitesCsv('LATE', 2100)
    const preview = await (await upload(analyst, csv, 'late.csv', 'text/csv')).json() as { id: string }
    // Between preview and commit the stored file changes: site LATE-8 becomes a second LATE-7, which the re-read refuses.
    const { rows: [file] } = await pool.query(`SELECT file_key FROM inventory_imports WHERE id = $1`, [preview.id])
    const changed = (await getObjectBuffer(file.file_key)).toString('utf8').replace('LATE-8,', 'LATE-7,')
    const stored = await putObject(file.file_key, Buffer.from(changed, 'utf8'), 'text/csv')
    await pool.query(`UPDATE inventory_imports SET file_sha256 = $2 WHERE id = $1`, [preview.id, stored.sha256])
    const before = await siteCount(org)
    expect((await analyst.post(`/api/inventory/imports/${preview.id}/commit`, {})).status).toBe(202)
    const done = await waitFor(analyst, preview.id, s => s.status !== 'committing')
    expect(done.status).toBe('failed')
    expect(done.failureMessage).toMatch(/nothing was imported/)
    expect(await siteCount(org)).toBe(before)
  }, 180_000)
})
