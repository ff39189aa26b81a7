// DELETE /api/tokens/:id — revoke any API token of the organisation. Admins; another
// organisation's token answers 404. Sessions only: API tokens never open /api/tokens.
import { revokeApiToken } from '~~/server/accounts/api-tokens'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.admins })
  const id = readId(event, 'API token')
  return await revokeApiToken(event, { userId: member.user.id }, id, { organisationId: member.organisationId })
})
