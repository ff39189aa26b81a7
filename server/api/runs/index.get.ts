// GET /api/runs?portfolioId= — the organisation's runs, newest first, with live progress.
import { z } from 'zod'
import { listRuns } from '~~/server/runs/queries'

const query = z.object({ portfolioId: z.uuid().optional() })

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const { portfolioId } = readValidQuery(event, query)
  return listRuns(member.organisationId, portfolioId)
})
