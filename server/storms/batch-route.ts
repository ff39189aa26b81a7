// Shared by the feed and the upload route: read the CSV body, refuse it whole with line-level
// messages, or store it with its job.
import type { H3Event } from 'h3'
import { parseStormBatch, STORM_BATCH_LIMITS } from './records'
import { storeStormBatch, type BatchOrigin } from './ingest'
import { fail } from '../utils/errors'

export async function receiveStormBatch(event: H3Event, origin: BatchOrigin) {
  const declared = Number(getRequestHeader(event, 'content-length') ?? 0)
  if (declared > STORM_BATCH_LIMITS.maxBytes) {
    fail(413, `The batch is larger than ${STORM_BATCH_LIMITS.maxBytes / 1024 / 1024} MB. Post it in parts.`)
  }
  const parsed = await parseStormBatch(event.node.req)
  if (!parsed.ok) throw createError({ statusCode: 400, statusMessage: parsed.message, data: { lineErrors: parsed.lineErrors, errorCount: parsed.errorCount } })
  const stored = await storeStormBatch(origin, parsed.records, parsed.sha256, event)
  setResponseStatus(event, stored.duplicate ? 200 : 202)
  return stored
}
