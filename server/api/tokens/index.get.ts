// GET /api/tokens — every open API token of the organisation, with its owner. Admins.
// Sessions only: API tokens never open /api/tokens (server/utils/auth.ts).
import { listApiTokens } from '~~/server/accounts/api-tokens'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.admins })
  return { tokens: await listApiTokens({ organisationId: member.organisationId }) }
})
