// GET /api/policy-terms?archived=hide|include|only — the organisation's policy-terms sets (one per portfolio) with their newest version (archived ones hidden by default).
import { archivedQuerySchema } from '~~/shared/schemas/archive'
import { listTermsSets } from '~~/server/insurance/terms-store'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const { archived } = readValidQuery(event, archivedQuerySchema)
  return listTermsSets(member.organisationId, archived)
})
