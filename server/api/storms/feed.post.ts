// POST /api/storms/feed — a lightning-data provider posts a batch of records (calibration CSV format,
// text/csv). Public in the session sense: authenticated by the feed's bearer token instead
// (Authorization: Bearer <token>), rate-limited per feed. Idempotent: the same batch again answers
// 200 with the stored batch; records known from earlier batches are kept once. All-or-nothing:
// any bad line refuses the batch (400, line-level messages in data.fields keyed `lines.<n>`, with data.errorCount).
import { receiveStormBatch } from '~~/server/storms/batch-route'
import { requireFeed } from '~~/server/storms/feed-auth'

export default defineEventHandler(async (event) => {
  const feed = await requireFeed(event)
  return receiveStormBatch(event, { organisationId: feed.organisationId, source: 'feed', feedId: feed.id, userId: null, fileName: `feed: ${feed.name}` })
})
