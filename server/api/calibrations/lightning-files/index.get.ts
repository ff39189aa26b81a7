// GET /api/calibrations/lightning-files — uploaded lightning-location files with their summaries (no content).
import { listLightningFiles } from '~~/server/calibration/queries'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  return listLightningFiles(member.organisationId)
})
