// GET /api/policy-terms/:id — one terms set with every version (newest first).
import { findTermsSet, listTermsVersions } from '~~/server/insurance/terms-store'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const id = readId(event, 'Policy terms')
  const set = await findTermsSet(member.organisationId, id)
  if (!set) notFound('Policy terms')
  return { set, versions: await listTermsVersions(set.id) }
})
