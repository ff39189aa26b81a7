// GET /api/storms/windows — storm windows the organisation may read (its own, and those of
// organisations sharing a portfolio with it), newest first.
import { listStormWindows } from '~~/server/storms/report'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.exporters })
  return listStormWindows(member)
})
