// Storm batches in: a checked batch (feed post or upload) is stored with its records in one
// transaction, each record once per organisation (unique on its identity), together with the
// 'storm.batch' job that works it. Posting the same batch again finds the stored one.
import { and, eq, sql } from 'drizzle-orm'
import type { H3Event } from 'h3'
import { withClientTransaction } from '../db/transaction'
import { stormBatches, stormFlashes } from '../db/schema'
import { queueOptions, useBoss } from '../jobs/queue'
import { recordAudit } from '../utils/audit'
import type { StormRecord } from './records'

export interface BatchOrigin {
  organisationId: string
  source: 'feed' | 'upload'
  feedId: string | null
  userId: string | null
  fileName: string
}

export interface StoredBatch { id: string, recordCount: number, newRecords: number, duplicate: boolean, state: string }

export async function storeStormBatch(origin: BatchOrigin, records: readonly StormRecord[], sha256: string, event?: H3Event): Promise<StoredBatch> {
  const boss = await useBoss()
  return withClientTransaction(async ({ tx, bossDb }) => {
    // Two posts of one batch at once: the second waits here and then finds the first.
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`storm-batch:${origin.organisationId}:${sha256}`}))`)
    const [existing] = await tx.select().from(stormBatches).where(and(eq(stormBatches.organisationId, origin.organisationId), eq(stormBatches.sha256, sha256)))
    if (existing) return { id: existing.id, recordCount: existing.recordCount, newRecords: existing.newRecords, duplicate: true, state: existing.state }
    const [batch] = await tx.insert(stormBatches).values({
      organisationId: origin.organisationId, feedId: origin.feedId, source: origin.source, fileName: origin.fileName,
      sha256, recordCount: records.length, newRecords: 0, createdBy: origin.userId,
    }).returning({ id: stormBatches.id })
    let fresh = 0
    for (let i = 0; i < records.length; i += 1000) {
      const rows = records.slice(i, i + 1000).map(r => ({
        organisationId: origin.organisationId, recordKey: r.recordKey, batchId: batch!.id, occurredAt: new Date(r.timeMs),
        latDeg: r.latDeg, lonDeg: r.lonDeg, peakCurrentKa: r.peakCurrentKa, type: r.type, locationErrorKm: r.locationErrorKm,
      }))
      const inserted = await tx.insert(stormFlashes).values(rows).onConflictDoNothing({ target: [stormFlashes.organisationId, stormFlashes.recordKey] }).returning({ id: stormFlashes.id })
      fresh += inserted.length
    }
    await tx.update(stormBatches).set({ newRecords: fresh }).where(eq(stormBatches.id, batch!.id))
    await boss.insert([{ name: 'storm.batch', data: { batchId: batch!.id }, singletonKey: batch!.id, ...queueOptions['storm.batch'] }], { db: bossDb })
    await recordAudit({
      organisationId: origin.organisationId, userId: origin.userId, action: 'upload', entity: 'storm_batch', entityId: batch!.id,
      after: { source: origin.source, feedId: origin.feedId, fileName: origin.fileName, records: records.length, newRecords: fresh, sha256 },
    }, { tx, event })
    return { id: batch!.id, recordCount: records.length, newRecords: fresh, duplicate: false, state: 'queued' }
  })
}
