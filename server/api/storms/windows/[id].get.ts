// GET /api/storms/windows/:id — one storm report: tanks ranked by P(fire) with the driving flash,
// expected fires, expected ground-up and insured loss (the reader's current terms), flashes and sites.
import { stormReport } from '~~/server/storms/report'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.exporters })
  return stormReport(member, readId(event, 'Storm window'))
})
