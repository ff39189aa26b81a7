// POST /api/calibrations/:id/assumption-version — the calibrated values as a new version of an assumption set, with provenance.
import { z } from 'zod'
import { applyToAssumptionsSchema } from '~~/shared/schemas/calibration'
import { applyToAssumptions } from '~~/server/calibration/apply'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const { id } = readValidParams(event, z.object({ id: z.uuid() }))
  const body = await readValidBody(event, applyToAssumptionsSchema)
  setResponseStatus(event, 201)
  return applyToAssumptions(member, event, id, body)
})
