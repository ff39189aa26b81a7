// GET /api/invitations — the organisation's invitations with their status. Admins.
import { listInvitations } from '~~/server/accounts/invitations'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.admins })
  return { invitations: await listInvitations(member.organisationId) }
})
