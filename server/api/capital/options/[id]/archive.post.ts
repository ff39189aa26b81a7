// POST /api/capital/options/:id/archive { archived } — archive (hide; no new actions) or restore a mitigation option; refused while an evaluation is in progress. Asset managers, admins.
import { archiveSchema } from '~~/shared/schemas/archive'
import { setArchived } from '~~/server/archive/records'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.planners })
  const id = readId(event, 'Option')
  const { archived } = await readValidBody(event, archiveSchema)
  return setArchived(member, event, 'mitigation_option', id, archived)
})
