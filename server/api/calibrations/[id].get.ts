// GET /api/calibrations/:id — one calibration: inputs, results with methods and intervals, its source file, where it was applied.
import { getCalibration } from '~~/server/calibration/queries'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const id = readId(event, 'Calibration')
  return getCalibration(member.organisationId, id)
})
