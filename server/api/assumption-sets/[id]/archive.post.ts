// POST /api/assumption-sets/:id/archive { archived } — archive (hide, keep) or restore an assumption set; refused while a run in progress uses it. Analysts, admins.
import { archiveSchema } from '~~/shared/schemas/archive'
import { setArchived } from '~~/server/archive/records'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const id = readId(event, 'Assumption set')
  const { archived } = await readValidBody(event, archiveSchema)
  return setArchived(member, event, 'assumption_set', id, archived)
})
