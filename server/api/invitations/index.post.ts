// POST /api/invitations — invite an e-mail address with a role; the link goes out by e-mail. Admins.
import { inviteSchema } from '~~/shared/schemas/auth'
import { createInvitation } from '~~/server/accounts/invitations'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.admins })
  const body = await readValidBody(event, inviteSchema)
  setResponseStatus(event, 201)
  return { invitation: await createInvitation(event, member, body.email, body.role) }
})
