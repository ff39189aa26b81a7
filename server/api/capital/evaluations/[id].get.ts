// GET /api/capital/evaluations/:id — one evaluation with every scenario's paired figures.
import { and, eq } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { capitalEvaluations, capitalScenarioResults } from '~~/server/db/schema'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const id = readId(event, 'Evaluation')
  const db = useDb()
  const [evaluation] = await db.select().from(capitalEvaluations).where(and(eq(capitalEvaluations.id, id), eq(capitalEvaluations.organisationId, member.organisationId)))
  if (!evaluation) notFound('Evaluation')
  const scenarios = await db.select().from(capitalScenarioResults).where(eq(capitalScenarioResults.evaluationId, id))
  return { ...evaluation, scenarios }
})
