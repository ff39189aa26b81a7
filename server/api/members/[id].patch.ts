// PATCH /api/members/:id — change a member's role (the id is the membership's). Admins. The last
// admin cannot be demoted (409).
import { memberUpdateSchema } from '~~/shared/schemas/auth'
import { changeMemberRole } from '~~/server/accounts/members'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.admins })
  const id = readId(event, 'Member')
  const body = await readValidBody(event, memberUpdateSchema)
  return { member: await changeMemberRole(event, member, id, body.role) }
})
