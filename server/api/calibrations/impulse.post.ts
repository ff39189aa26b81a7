// POST /api/calibrations/impulse — U50 by up-and-down and U50, σ by maximum likelihood from a test series; stored and audited.
import { impulseCalibrationSchema } from '~~/shared/schemas/calibration'
import { runImpulseCalibration } from '~~/server/calibration/impulse'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const body = await readValidBody(event, impulseCalibrationSchema)
  setResponseStatus(event, 201)
  return runImpulseCalibration(member, event, body)
})
