// GET /api/calibrations?archived=hide|include|only — past calibrations of the organisation, newest first, with their headline figures (archived ones hidden by default).
import { archivedQuerySchema } from '~~/shared/schemas/archive'
import { listCalibrations } from '~~/server/calibration/queries'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const { archived } = readValidQuery(event, archivedQuerySchema)
  return listCalibrations(member.organisationId, archived)
})
