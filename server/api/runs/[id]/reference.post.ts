// POST /api/runs/:id/reference — make a finished run its portfolio's reference run, the one the
// overview opens (analysts, admins); the previous reference run of the portfolio stops being one; audited.
import { markReferenceRun } from '~~/server/runs/reference'
import { getRun } from '~~/server/runs/queries'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const id = readId(event, 'Run')
  await markReferenceRun(id, { organisationId: member.organisationId, userId: member.user.id }, event)
  return getRun(member.organisationId, id)
})
