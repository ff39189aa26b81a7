// DELETE /api/auth/tokens/:id — revoke one of one's own API tokens (any organisation); it stops
// working on the next request. Any member; another person's token answers 404.
// Sessions only: API tokens never open /api/auth/ (server/utils/auth.ts).
import { revokeApiToken } from '~~/server/accounts/api-tokens'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.everyone })
  const id = readId(event, 'API token')
  return await revokeApiToken(event, { userId: member.user.id }, id, { userId: member.user.id })
})
