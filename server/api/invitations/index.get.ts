// GET /api/invitations — the organisation's invitations with their status. Admins.
export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.admins })
  return { invitations: await listInvitations(member.organisationId) }
})
