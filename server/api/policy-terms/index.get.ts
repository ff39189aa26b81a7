// GET /api/policy-terms — the organisation's policy-terms sets (one per portfolio) with their newest version.
import { listTermsSets } from '~~/server/insurance/terms-store'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  return listTermsSets(member.organisationId)
})
