// POST /api/calibrations/:id/assumption-version — the calibrated values as a new version of an assumption set, with provenance.
import { applyToAssumptionsSchema } from '~~/shared/schemas/calibration'
import { applyToAssumptions } from '~~/server/calibration/apply'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const id = readId(event, 'Calibration')
  const body = await readValidBody(event, applyToAssumptionsSchema)
  setResponseStatus(event, 201)
  return applyToAssumptions(member, event, id, body)
})
