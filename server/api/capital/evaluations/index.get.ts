// GET /api/capital/evaluations — the organisation's scenario evaluations, newest first, with progress.
import { desc, eq } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { capitalEvaluations } from '~~/server/db/schema'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  return useDb().select().from(capitalEvaluations).where(eq(capitalEvaluations.organisationId, member.organisationId)).orderBy(desc(capitalEvaluations.createdAt)).limit(50)
})
