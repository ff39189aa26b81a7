// POST /api/auth/tokens — make a personal API token: { name, expiresOn (YYYY-MM-DD, at most one
// year ahead), readOnly, organisationId (default: the current one) }. Any member, for an
// organisation they belong to. The answer carries the secret once; only its SHA-256 is kept.
// Sessions only: API tokens never open /api/auth/ (server/utils/auth.ts).
import { createApiTokenSchema } from '~~/shared/schemas/auth'
import { createApiToken } from '~~/server/accounts/api-tokens'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.everyone })
  const body = await readValidBody(event, createApiTokenSchema)
  setResponseStatus(event, 201)
  return await createApiToken(event, { userId: member.user.id, organisationId: body.organisationId ?? member.organisationId }, body)
})
