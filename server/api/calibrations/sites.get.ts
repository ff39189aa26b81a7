// GET /api/calibrations/sites — the organisation's sites with their reference points and current flash density, to choose from.
import { listSites } from '~~/server/calibration/sites'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  return listSites(member.organisationId)
})
