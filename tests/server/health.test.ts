import { describe, expect, inject, it } from 'vitest'
import journal from '../../drizzle/meta/_journal.json'

describe('GET /api/health', () => {
  it('reports the database reachable, the latest migration applied and the queue reachable', async () => {
    const res = await fetch(`${inject('baseUrl')}/api/health`)
    expect(res.status).toBe(200)
    const body = await res.json()
    expect(body.status).toBe('ok')
    expect(body.database.reachable).toBe(true)
    // The newest entry of drizzle-kit's journal is what the database must be at (common practice).
    expect(body.migrations.latest).toBe(journal.entries.at(-1)!.tag)
    expect(body.migrations.pending).toBe(0)
    expect(body.queue.reachable).toBe(true)
    expect(body.version).toMatch(/^\d+\.\d+\.\d+/)
  })
})
