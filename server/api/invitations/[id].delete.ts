// DELETE /api/invitations/:id — withdraw an open invitation; its link stops working. Admins.
import { idParamsSchema } from '~~/shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.admins })
  const { id } = await getValidatedRouterParams(event, idParamsSchema.parse)
  return { invitation: await revokeInvitation(event, member, id) }
})
