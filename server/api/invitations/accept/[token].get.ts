// GET /api/invitations/accept/:token — what an invitation link offers (organisation, role, whether
// the address has an account, whether the caller is signed in as it). Public: the token is the
// credential. 404 unknown, 410 no longer usable.
import { tokenParamsSchema } from '~~/shared/schemas/auth'
import { describeInvitation } from '~~/server/accounts/invitations'

export default defineEventHandler(async (event) => {
  const { token } = readValidParams(event, tokenParamsSchema)
  return await describeInvitation(event, token)
})
