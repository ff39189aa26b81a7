// POST /api/calibrations/:id/site-flash-densities — a lightning calibration's Ng written onto chosen sites (audited).
import { z } from 'zod'
import { applyToSitesSchema } from '~~/shared/schemas/calibration'
import { applyToSites } from '~~/server/calibration/apply'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const { id } = readValidParams(event, z.object({ id: z.uuid() }))
  const body = await readValidBody(event, applyToSitesSchema)
  return applyToSites(member, event, id, body.siteIds)
})
