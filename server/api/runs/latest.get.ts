// GET /api/runs/latest?portfolioId= — the newest succeeded run (of a portfolio), or 404 when none.
import { z } from 'zod'
import { latestSucceededRun } from '~~/server/results/queries'

const query = z.object({ portfolioId: z.uuid().optional() })

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const { portfolioId } = readValidQuery(event, query)
  const run = await latestSucceededRun(member.organisationId, portfolioId)
  if (!run) notFound('A finished run')
  return { id: run.id, portfolioId: run.portfolioId, portfolioName: run.portfolioName, mode: run.mode, finishedAt: run.finishedAt }
})
