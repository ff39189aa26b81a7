// POST /api/calibrations/lightning — Ng per site and the current fit from an uploaded records file; stored and audited.
import { lightningCalibrationSchema } from '~~/shared/schemas/calibration'
import { runLightningCalibration } from '~~/server/calibration/lightning'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const body = await readValidBody(event, lightningCalibrationSchema)
  setResponseStatus(event, 201)
  return runLightningCalibration(member, event, body)
})
