// Shared by the feed and the upload route: read the CSV body, refuse it whole with line-level
// messages, or store it with its job. A refused batch answers the one error contract: `data.fields`
// keyed `lines.<n>` (the line number in the file, header = line 1) with that line's message, the
// first 200 bad lines, and `data.errorCount`, how many lines were bad in all (DEVELOPERS.md).
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
  if (!parsed.ok) {
    const fields = Object.fromEntries(parsed.lineErrors.map(e => [`lines.${e.line}`, e.message]))
    fail(400, parsed.message, Object.keys(fields).length ? fields : undefined, { errorCount: parsed.errorCount })
  }
  const stored = await storeStormBatch(origin, parsed.records, parsed.sha256, event)
  setResponseStatus(event, stored.duplicate ? 200 : 202)
  return stored
}
