// POST /api/invitations/accept/:token — accept an invitation: a new account sends its name and
// password; an existing account is simply added. Public: the token is the credential. Single use.
import { acceptInvitationSchema, tokenParamsSchema } from '~~/shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const { token } = readValidParams(event, tokenParamsSchema)
  const body = await readValidBody(event, acceptInvitationSchema)
  return await acceptInvitation(event, token, body)
})
