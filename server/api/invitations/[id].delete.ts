// DELETE /api/invitations/:id — withdraw an open invitation; its link stops working. Admins.
import { idParamsSchema } from '~~/shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.admins })
  const { id } = readValidParams(event, idParamsSchema)
  return { invitation: await revokeInvitation(event, member, id) }
})
