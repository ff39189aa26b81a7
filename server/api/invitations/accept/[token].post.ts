// POST /api/invitations/accept/:token — accept an invitation: a new account sends its name and
// password; an existing account must be signed in as the invited address, or send its current
// password (then it is signed in). Public: the token and the account's consent are the credential.
// Single use.
import { acceptInvitationSchema, tokenParamsSchema } from '~~/shared/schemas/auth'
import { acceptInvitation } from '~~/server/accounts/invitations'

export default defineEventHandler(async (event) => {
  const { token } = readValidParams(event, tokenParamsSchema)
  const body = await readValidBody(event, acceptInvitationSchema)
  return await acceptInvitation(event, token, body)
})
