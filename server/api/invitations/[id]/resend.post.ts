// POST /api/invitations/:id/resend — a new link for 7 more days; the old link stops working. Admins.
import { resendInvitation } from '~~/server/accounts/invitations'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.admins })
  const id = readId(event, 'Invitation')
  return { invitation: await resendInvitation(event, member, id) }
})
