// GET /api/auth/tokens — the signed-in person's open API tokens in every organisation (name,
// organisation, created, expires, last use and address, read-only; never the secret). Any member;
// only ever one's own. Sessions only: API tokens never open /api/auth/ (server/utils/auth.ts).
import { listApiTokens } from '~~/server/accounts/api-tokens'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.everyone })
  return { tokens: await listApiTokens({ userId: member.user.id }) }
})
