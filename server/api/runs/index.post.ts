// POST /api/runs — start a run of a portfolio with an assumption-set version (analysts, admins).
import { startRunSchema } from '~~/shared/schemas/runs'
import { EngineInputError } from '~~/shared/engine/assumptions'
import { RunStartError, startRun } from '~~/server/runs/start'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const body = await readValidBody(event, startRunSchema)
  try {
    const run = await startRun(body, { userId: member.user.id, organisationId: member.organisationId })
    setResponseStatus(event, 201)
    return run
  } catch (error) {
    if (error instanceof RunStartError) throw createError({ statusCode: error.statusCode, statusMessage: error.message })
    if (error instanceof EngineInputError) badRequest(error.message, { issues: error.issues })
    throw error
  }
})
