// GET /api/capital/best-plan?budget=&metric= — ranking, the best plan under the budget and the efficient frontier, from the latest evaluation.
import { bestPlanQuerySchema } from '~~/shared/schemas/capital'
import { useDb } from '~~/server/db'
import { planForBudget } from '~~/server/capital/plans'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const { budget, metric } = readValidQuery(event, bestPlanQuerySchema)
  return { currency: member.currency, ...(await planForBudget(useDb(), member.organisationId, budget, metric)) }
})
