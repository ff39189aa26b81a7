// POST /api/runs/:id/cancel — stop a queued or running run; its partial results are removed.
import { endRunUnsuccessfully, notifyRunEnded } from '~~/server/runs/ending'
import { getRun } from '~~/server/runs/queries'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const id = readId(event, 'Run')
  const run = await getRun(member.organisationId, id)
  if (!run) notFound('Run')
  const cancelled = await endRunUnsuccessfully(id, 'cancelled', `Cancelled by ${member.user.name}`)
  if (!cancelled) conflict(`The run has already ended (${run.state}).`)
  await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'cancel', entity: 'run', entityId: id }, { event })
  await notifyRunEnded(id)
  return getRun(member.organisationId, id)
})
