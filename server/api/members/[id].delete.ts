// DELETE /api/members/:id — remove a member from the organisation (their account stays). Admins.
// The last admin cannot be removed (409).
import { removeMember } from '~~/server/accounts/members'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.admins })
  const id = readId(event, 'Member')
  return await removeMember(event, member, id)
})
