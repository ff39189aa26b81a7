// GET /api/calibrations/:id/source — the source file of a calibration, exactly as uploaded (or as the entered series).
import { findSourceFile } from '~~/server/calibration/queries'
import { calibrationContentStream } from '~~/server/calibration/files'
import { setDownloadHeaders } from '~~/server/utils/downloads'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const id = readId(event, 'Calibration')
  const file = await findSourceFile(member.organisationId, id)
  const safeName = file.fileName.replace(/[^\w.-]+/g, '_')
  // Streamed from object storage, decompressed on the way (never held whole).
  const stream = await calibrationContentStream(file)
  setDownloadHeaders(event, safeName, 'csv')
  return sendStream(event, stream)
})
