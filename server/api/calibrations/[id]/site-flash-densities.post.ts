// POST /api/calibrations/:id/site-flash-densities — a lightning calibration's Ng written onto chosen sites (audited).
import { applyToSitesSchema } from '~~/shared/schemas/calibration'
import { applyToSites } from '~~/server/calibration/apply'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const id = readId(event, 'Calibration')
  const body = await readValidBody(event, applyToSitesSchema)
  return applyToSites(member, event, id, body.siteIds)
})
