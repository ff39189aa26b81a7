// POST /api/storms/uploads?name=… — a lightning-location CSV (the calibration format) as the raw
// request body, taken as storm records: checked whole, refused with line-level messages or stored
// and worked in the background like a feed batch.
import { z } from 'zod'
import { receiveStormBatch } from '~~/server/storms/batch-route'

const querySchema = z.object({ name: z.string().trim().min(1, 'Give the file name (?name=…).').max(200) })

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const { name } = readValidQuery(event, querySchema)
  return receiveStormBatch(event, { organisationId: member.organisationId, source: 'upload', feedId: null, userId: member.user.id, fileName: name })
})
