// GET /api/runs/:id — one run: inputs, state, progress and (once succeeded) portfolio results.
import { getRun } from '~~/server/runs/queries'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const id = readId(event, 'Run')
  const run = await getRun(member.organisationId, id)
  if (!run) notFound('Run')
  return run
})
