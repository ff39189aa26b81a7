// DELETE /api/assumption-sets/:id — delete an assumption set and its versions; refused once a run or evaluation used it (archive it then). Analysts, admins.
import { deleteRecord } from '~~/server/archive/records'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const id = readId(event, 'Assumption set')
  await deleteRecord(member, event, 'assumption_set', id)
  setResponseStatus(event, 204)
  return null
})
