// POST /api/capital/evaluations — measure every candidate action (or a saved plan's actions, together per site) against the baseline on common random numbers (analysts, admins).
import { startEvaluationSchema } from '~~/shared/schemas/capital'
import { startEvaluation } from '~~/server/capital/evaluations'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const body = await readValidBody(event, startEvaluationSchema)
  const evaluation = await startEvaluation(body, { userId: member.user.id, organisationId: member.organisationId, via: auditVia(event) })
  setResponseStatus(event, 201)
  return evaluation
})
