// POST /api/calibrations/storm-clustering — storm spread σ and flashes per storm (Thomas process, minimum contrast on Ripley's K, bootstrap intervals) from an uploaded records file; stored and audited.
import { stormClusteringCalibrationSchema } from '~~/shared/schemas/calibration'
import { runStormClusteringCalibration } from '~~/server/calibration/storm-clustering'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const body = await readValidBody(event, stormClusteringCalibrationSchema)
  setResponseStatus(event, 201)
  return runStormClusteringCalibration(member, event, body)
})
