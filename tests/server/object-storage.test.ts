// Uploaded inventory files live in object storage (issue #19 point 5): the row keeps key, size and
// SHA-256; the commit re-reads the object; files kept in PostgreSQL before are moved by the move
// script; an unreachable store answers 503 and leaves nothing half-written.
import { createHash } from 'node:crypto'
import { gunzipSync, gzipSync } from 'node:zlib'
import { spawnSync } from 'node:child_process'
import { resolve } from 'node:path'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { SHEET_COLUMNS } from '../../shared/inventory-layout'
import { createOrganisation, memberClient, type Client } from '../support/accounts'
import { appEnv, root } from '../support/app-process'
import { testPool } from '../support/db'
import { inventoryCounts, siteRow, upload } from '../support/inventory'
import { pauseObjectStore, resumeObjectStore, useTestObjectStore } from '../support/objects'
import { deleteObject, getObjectBuffer, headObject, putObject } from '../../server/storage/objects'

useTestObjectStore()
const pool = testPool()
let org: string
let analyst: Client
afterAll(() => pool.end())

beforeAll(async () => {
  org = await createOrganisation(pool, 'Object Storage Test Operator')
  analyst = await memberClient(pool, org, 'analyst')
})

function sitesCsv(prefix: string, n: number): string {
  const headers = SHEET_COLUMNS.Sites.map(c => c.header)
  const lines = [headers.join(',')]
  for (let i = 0; i < n; i++) {
    const row = siteRow(`${prefix}-${i}`)
    lines.push(headers.map(h => String(row[h] ?? '')).join(','))
  }
  return `${lines.join('\r\n')}\r\n`
}

const sha256 = (data: Buffer | string) => createHash('sha256').update(data).digest('hex')

async function preview(csv: string, name: string): Promise<string> {
  const res = await upload(analyst, csv, name, 'text/csv')
  expect(res.status, await res.clone().text()).toBe(201)
  return (await res.json() as { id: string }).id
}

async function stored(id: string) {
  const { rows } = await pool.query(`SELECT file_key, file_sha256, size_bytes, file_data IS NULL AS no_bytes FROM inventory_imports WHERE id = $1`, [id])
  return rows[0] as { file_key: string | null, file_sha256: string | null, size_bytes: number, no_bytes: boolean }
}

describe('inventory files in object storage', () => {
  it('an upload is stored in the S3 fake with its SHA-256, and the commit re-reads it from there', async () => {
    const csv = sitesCsv('OS', 3)
    const id = await preview(csv, 'os.csv')
    const row = await stored(id)
    // The SHA-256 is computed here from the uploaded bytes (closed form: FIPS 180-4 through node:crypto).
    expect(row).toMatchObject({ file_sha256: sha256(csv), size_bytes: Buffer.byteLength(csv), no_bytes: true })
    expect(row.file_key).toMatch(new RegExp(`^inventory-imports/${org}/`))
    expect(await headObject(row.file_key!)).toEqual({ sizeBytes: Buffer.byteLength(csv), sha256: sha256(csv) })
    expect((await getObjectBuffer(row.file_key!)).toString('utf8')).toBe(csv)

    const res = await analyst.post(`/api/inventory/imports/${id}/commit`, {})
    expect(res.status, await res.clone().text()).toBe(200)
    expect((await inventoryCounts(pool, org)).sites).toBe(3) // the three rows of the file
  })

  it('a commit reads the object, not a copy: an object that no longer matches its SHA-256 is refused and nothing is written', async () => {
    const id = await preview(sitesCsv('TAMPER', 2), 'tamper.csv')
    const row = await stored(id)
    await putObject(row.file_key!, Buffer.from(sitesCsv('TAMPER', 4)), 'text/csv') // the object changes under the row
    const before = await inventoryCounts(pool, org)
    const res = await analyst.post(`/api/inventory/imports/${id}/commit`, {})
    expect(res.status).toBe(500)
    expect((await res.json() as { statusMessage: string }).statusMessage).toMatch(/does not match its recorded SHA-256/)
    expect(await inventoryCounts(pool, org)).toEqual(before)
  })

  it('the move script moves a row whose bytes are still in PostgreSQL, checks the SHA-256, clears the bytes, and is idempotent', async () => {
    const csv = sitesCsv('LEGACY', 2)
    const id = await preview(csv, 'legacy.csv')
    const first = await stored(id)
    // Make it a row from before object storage: the bytes in the column, no key, no object.
    await pool.query(`UPDATE inventory_imports SET file_data = $2, file_key = NULL, file_sha256 = NULL WHERE id = $1`, [id, Buffer.from(csv)])
    await deleteObject(first.file_key!)

    const env = { ...appEnv({ dbName: inject('dbName'), port: inject('appPort'), mailPort: inject('mailPort'), s3Port: inject('s3Port'), seedDemo: false }) }
    delete env.DATABASE_URL
    const move = () => spawnSync(resolve(root, 'node_modules/.bin/tsx'), ['scripts/move-files-to-storage.ts'], { cwd: root, env, encoding: 'utf8' })
    const once = move()
    expect(once.status, once.stderr).toBe(0)
    const moved = await stored(id)
    expect(moved).toMatchObject({ file_sha256: sha256(csv), size_bytes: Buffer.byteLength(csv), no_bytes: true })
    expect((await getObjectBuffer(moved.file_key!)).toString('utf8')).toBe(csv)

    const twice = move()
    expect(twice.status, twice.stderr).toBe(0)
    expect((await stored(id)).file_key).toBe(moved.file_key) // a second run leaves moved rows alone

    const res = await analyst.post(`/api/inventory/imports/${id}/commit`, {})
    expect(res.status, await res.clone().text()).toBe(200)
  }, 60_000)

  it('a lightning-records file is stored gzip-compressed in the S3 fake, and the move script moves a legacy one', async () => {
    // Three valid records in the documented column layout (README "Lightning-location records").
    const csv = 'time,latitude,longitude,peak_current_ka,type\n2021-06-01T10:00:00Z,29.70,-95.30,-31,ground\n2021-06-01T10:00:05Z,29.71,-95.31,-12,ground\n2021-06-02T11:00:00Z,29.72,-95.32,25,ground\n'
    const res = await fetch(`${inject('baseUrl')}/api/calibrations/lightning-files?name=os-strokes.csv`, { method: 'POST', headers: { 'cookie': analyst.cookie, 'content-type': 'text/csv' }, body: csv })
    const file = await res.json() as { id: string, statusMessage?: string }
    expect(res.status, file.statusMessage).toBe(201)
    const read = async () => (await pool.query(`SELECT content_key, content_size, content_sha256, content_gzip IS NULL AS no_bytes, sha256 FROM calibration_files WHERE id = $1`, [file.id])).rows[0]
    const row = await read()
    expect(row.no_bytes).toBe(true)
    expect(row.sha256).toBe(sha256(csv)) // the original file's SHA-256 (closed form, node:crypto)
    const object = await getObjectBuffer(row.content_key)
    expect(gunzipSync(object).toString('utf8')).toBe(csv) // the object is the file, gzip-compressed
    expect({ size: Number(row.content_size), sha: row.content_sha256 }).toEqual({ size: object.length, sha: sha256(object) })

    // A row from before object storage: the compressed bytes in the column, no key.
    await pool.query(`UPDATE calibration_files SET content_gzip = $2, content_key = NULL, content_size = NULL, content_sha256 = NULL WHERE id = $1`, [file.id, gzipSync(csv)])
    await deleteObject(row.content_key)
    const env = { ...appEnv({ dbName: inject('dbName'), port: inject('appPort'), mailPort: inject('mailPort'), s3Port: inject('s3Port'), seedDemo: false }) }
    delete env.DATABASE_URL
    const moved = spawnSync(resolve(root, 'node_modules/.bin/tsx'), ['scripts/move-files-to-storage.ts'], { cwd: root, env, encoding: 'utf8' })
    expect(moved.status, moved.stderr).toBe(0)
    const after = await read()
    expect(after.no_bytes).toBe(true)
    expect(gunzipSync(await getObjectBuffer(after.content_key, after.content_sha256)).toString('utf8')).toBe(csv)
  }, 60_000)

  it('an unreachable store answers 503 with a readable message and leaves no row pointing at a missing object', async () => {
    const pending = await preview(sitesCsv('DOWN-P', 2), 'down-pending.csv')
    const count = async () => (await pool.query(`SELECT count(*)::int AS n FROM inventory_imports WHERE organisation_id = $1`, [org])).rows[0].n as number
    const before = await count()
    const sites = await inventoryCounts(pool, org)
    pauseObjectStore()
    try {
      const res = await upload(analyst, sitesCsv('DOWN', 2), 'down.csv', 'text/csv')
      expect(res.status).toBe(503)
      expect((await res.json() as { statusMessage: string }).statusMessage).toMatch(/File storage is not reachable/)
      expect(await count()).toBe(before)

      const commit = await analyst.post(`/api/inventory/imports/${pending}/commit`, {})
      expect(commit.status).toBe(503)
      expect(await inventoryCounts(pool, org)).toEqual(sites)
    }
    finally {
      resumeObjectStore()
    }
    // Back up: the pending import commits.
    expect((await analyst.post(`/api/inventory/imports/${pending}/commit`, {})).status).toBe(200)
  }, 60_000)
})
