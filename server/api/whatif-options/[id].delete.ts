// DELETE /api/whatif-options/:id — remove a saved what-if option (everyone but viewers); an action it became stays in the capital plan; audited.
import { deleteWhatIfOption } from '~~/server/whatif/options'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.contributors })
  const id = readId(event, 'Saved option')
  await deleteWhatIfOption(id, { organisationId: member.organisationId, userId: member.user.id }, event)
  setResponseStatus(event, 204)
  return null
})
