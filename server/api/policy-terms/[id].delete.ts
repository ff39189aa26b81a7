// DELETE /api/policy-terms/:id — delete a policy-terms set and its versions; refused once a run used them (archive them then). Underwriting roles.
import { deleteRecord } from '~~/server/archive/records'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.underwriting })
  const id = readId(event, 'Policy terms')
  await deleteRecord(member, event, 'policy_terms_set', id)
  setResponseStatus(event, 204)
  return null
})
