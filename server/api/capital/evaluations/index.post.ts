// POST /api/capital/evaluations — measure every candidate action (or a saved plan's actions, together per site) against the baseline on common random numbers (analysts, admins).
import { startEvaluationSchema } from '~~/shared/schemas/capital'
import { EngineInputError } from '~~/shared/engine/assumptions'
import { EvaluationStartError, startEvaluation } from '~~/server/capital/evaluations'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const body = await readValidBody(event, startEvaluationSchema)
  try {
    const evaluation = await startEvaluation(body, { userId: member.user.id, organisationId: member.organisationId })
    setResponseStatus(event, 201)
    return evaluation
  } catch (error) {
    if (error instanceof EvaluationStartError) throw createError({ statusCode: error.statusCode, statusMessage: error.message })
    if (error instanceof EngineInputError) badRequest(error.message, { issues: error.issues })
    throw error
  }
})
