// DELETE /api/calibrations/:id — delete a calibration; refused when a run used an assumption version made from it. Analysts, admins.
import { deleteRecord } from '~~/server/archive/records'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const id = readId(event, 'Calibration')
  await deleteRecord(member, event, 'calibration', id)
  setResponseStatus(event, 204)
  return null
})
