// GET /api/whatif-options?runId=&siteId= — the organisation's saved what-if options, newest first (of one run's site when asked).
import { whatIfOptionsQuerySchema } from '~~/shared/schemas/whatif'
import { listWhatIfOptions } from '~~/server/whatif/options'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const filter = readValidQuery(event, whatIfOptionsQuerySchema)
  return listWhatIfOptions(member.organisationId, filter)
})
