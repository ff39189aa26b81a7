// GET /api/members — the organisation's members with their roles. Admins.
import { listMembers } from '~~/server/accounts/members'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.admins })
  return { members: await listMembers(member.organisationId), me: member.user.id }
})
