// DELETE /api/invitations/:id — withdraw an open invitation; its link stops working. Admins.
import { revokeInvitation } from '~~/server/accounts/invitations'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.admins })
  const id = readId(event, 'Invitation')
  return { invitation: await revokeInvitation(event, member, id) }
})
