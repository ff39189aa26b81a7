// DELETE /api/capital/options/:id — delete a mitigation option and its actions; refused while a saved plan includes them or an evaluation is in progress. Asset managers, admins.
import { deleteRecord } from '~~/server/archive/records'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.planners })
  const id = readId(event, 'Option')
  await deleteRecord(member, event, 'mitigation_option', id)
  setResponseStatus(event, 204)
  return null
})
