// POST /api/calibrations/:id/archive { archived } — archive (hide, keep) or restore a calibration. Analysts, admins.
import { archiveSchema } from '~~/shared/schemas/archive'
import { setArchived } from '~~/server/archive/records'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const id = readId(event, 'Calibration')
  const { archived } = await readValidBody(event, archiveSchema)
  return setArchived(member, event, 'calibration', id, archived)
})
