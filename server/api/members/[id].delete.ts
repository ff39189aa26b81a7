// DELETE /api/members/:id — remove a member from the organisation (their account stays). Admins.
// The last admin cannot be removed (409).
import { idParamsSchema } from '~~/shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.admins })
  const { id } = readValidParams(event, idParamsSchema)
  return await removeMember(event, member, id)
})
