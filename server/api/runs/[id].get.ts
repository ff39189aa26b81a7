// GET /api/runs/:id — one run: inputs, state, progress and (once succeeded) portfolio results.
import { runIdParams } from '~~/shared/schemas/runs'
import { getRun } from '~~/server/runs/queries'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const { id } = readValidParams(event, runIdParams)
  const run = await getRun(member.organisationId, id)
  if (!run) notFound('Run')
  return run
})
