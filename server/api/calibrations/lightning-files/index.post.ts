// POST /api/calibrations/lightning-files?name=… — a lightning-location CSV as the raw request body,
// checked line by line while it streams in; stored (compressed) only when every row is valid.
import { z } from 'zod'
import { LIGHTNING_LIMITS } from '~~/shared/calibration'
import { storeLightningFile } from '~~/server/calibration/lightning'

const querySchema = z.object({ name: z.string().trim().min(1, 'Give the file name (?name=…).').max(200) })

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const { name } = readValidQuery(event, querySchema)
  const declared = Number(getRequestHeader(event, 'content-length') ?? 0)
  if (declared > LIGHTNING_LIMITS.maxBytes) {
    throw createError({ statusCode: 413, statusMessage: `The file is larger than ${LIGHTNING_LIMITS.maxBytes / 1024 / 1024} MB, the most one upload may be. Split it by period or region.` })
  }
  setResponseStatus(event, 201)
  return storeLightningFile(member, event, name, event.node.req)
})
