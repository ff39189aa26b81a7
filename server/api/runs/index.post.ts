// POST /api/runs — start a run of a portfolio with an assumption-set version (analysts, admins).
import { startRunSchema } from '~~/shared/schemas/runs'
import { startRun } from '~~/server/runs/start'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const body = await readValidBody(event, startRunSchema)
  const run = await startRun(body, { userId: member.user.id, organisationId: member.organisationId, via: auditVia(event) })
  setResponseStatus(event, 201)
  return run
})
