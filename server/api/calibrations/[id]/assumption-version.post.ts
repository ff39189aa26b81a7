// POST /api/calibrations/:id/assumption-version — the calibrated values as a new version of an assumption set, with provenance.
import { z } from 'zod'
import { applyToAssumptionsSchema } from '~~/shared/schemas/calibration'
import { applyToAssumptions } from '~~/server/calibration/apply'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const { id } = await getValidatedRouterParams(event, z.object({ id: z.uuid() }).parse)
  const body = await readValidatedBody(event, applyToAssumptionsSchema.parse)
  setResponseStatus(event, 201)
  return applyToAssumptions(member, event, id, body)
})
