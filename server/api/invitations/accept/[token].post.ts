// POST /api/invitations/accept/:token — accept an invitation: a new account sends its name and
// password; an existing account must be signed in as the invited address, or send its current
// password (then it is signed in). Public: the token and the account's consent are the credential.
// Single use.
import { acceptInvitationSchema, tokenParamsSchema } from '~~/shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const { token } = await getValidatedRouterParams(event, tokenParamsSchema.parse)
  const body = await readValidatedBody(event, acceptInvitationSchema.parse)
  return await acceptInvitation(event, token, body)
})
