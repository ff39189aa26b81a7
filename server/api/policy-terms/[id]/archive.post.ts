// POST /api/policy-terms/:id/archive { archived } — archive (hide; new runs no longer record them) or restore a policy-terms set; refused while a run in progress uses it. Underwriting roles.
import { archiveSchema } from '~~/shared/schemas/archive'
import { setArchived } from '~~/server/archive/records'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.underwriting })
  const id = readId(event, 'Policy terms')
  const { archived } = await readValidBody(event, archiveSchema)
  return setArchived(member, event, 'policy_terms_set', id, archived)
})
