// GET /api/calibrations — past calibrations of the organisation, newest first, with their headline figures.
import { listCalibrations } from '~~/server/calibration/queries'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  return listCalibrations(member.organisationId)
})
