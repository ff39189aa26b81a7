// GET /api/calibrations/:id/source — the source file of a calibration, exactly as uploaded (or as the entered series).
import { findSourceFile } from '~~/server/calibration/queries'
import { storedFileStream } from '~~/server/calibration/lightning-files'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const id = readId(event, 'Calibration')
  const file = await findSourceFile(member.organisationId, id)
  const safeName = file.fileName.replace(/[^\w.-]+/g, '_')
  setResponseHeaders(event, { 'content-type': 'text/csv; charset=utf-8', 'content-disposition': `attachment; filename="${safeName}"` })
  return sendStream(event, storedFileStream(file.content))
})
