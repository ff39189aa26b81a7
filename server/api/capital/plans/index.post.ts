// POST /api/capital/plans — save the best plan for a budget under a name (asset managers, admins).
import { savePlanSchema } from '~~/shared/schemas/capital'
import { useDb } from '~~/server/db'
import { capitalPlans } from '~~/server/db/schema'
import { planForBudget } from '~~/server/capital/plans'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.planners })
  const body = await readValidBody(event, savePlanSchema)
  const db = useDb()
  const computed = await planForBudget(db, member.organisationId, body.budget, body.metric)
  if (!computed.evaluation) badRequest('No evaluation has measured the actions yet. Ask an analyst to evaluate them first.')
  const plan = await db.transaction(async (tx) => {
    const [row] = await tx.insert(capitalPlans).values({
      organisationId: member.organisationId, name: body.name, budget: body.budget, metric: body.metric, evaluationId: computed.evaluation!.id,
      actionIds: computed.plan.chosen, totalCost: computed.plan.totalCost, reduction: computed.plan.totalValue, createdBy: member.user.id,
    }).onConflictDoNothing().returning()
    if (!row) conflict(`A plan named "${body.name}" exists already.`)
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'create', entity: 'capital_plan', entityId: row.id, after: { name: body.name, budget: body.budget, actions: computed.plan.chosen.length, totalCost: computed.plan.totalCost } }, { tx, event })
    return row
  })
  setResponseStatus(event, 201)
  return plan
})
