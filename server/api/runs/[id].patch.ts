// PATCH /api/runs/:id — rename a run (analysts, admins); audited.
import { renameRunSchema } from '~~/shared/schemas/runs'
import { renameRun } from '~~/server/runs/reference'
import { getRun } from '~~/server/runs/queries'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const id = readId(event, 'Run')
  const { name } = await readValidBody(event, renameRunSchema)
  await renameRun(id, name, { organisationId: member.organisationId, userId: member.user.id }, event)
  return getRun(member.organisationId, id)
})
