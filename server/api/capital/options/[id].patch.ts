// PATCH /api/capital/options/:id — edit an option's costs or name; its actions are re-priced (asset managers, admins).
import { and, eq } from 'drizzle-orm'
import { updateOptionSchema } from '~~/shared/schemas/capital'
import { useDb } from '~~/server/db'
import { capitalActions, mitigationOptions } from '~~/server/db/schema'
import { costTanks, priceAction } from '~~/server/capital/create-actions'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.planners })
  const id = readId(event, 'Option')
  const body = await readValidBody(event, updateOptionSchema)
  if (Object.keys(body).length === 0) badRequest('Give what to change: the name, the fixed cost, the rate, the cost basis or the costing step.')
  return useDb().transaction(async (tx) => {
    const [before] = await tx.select().from(mitigationOptions).where(and(eq(mitigationOptions.id, id), eq(mitigationOptions.organisationId, member.organisationId))).for('update')
    if (!before) notFound('Option')
    const [after] = await tx.update(mitigationOptions).set(body).where(eq(mitigationOptions.id, id)).returning()
    const actions = await tx.select({ id: capitalActions.id, tankId: capitalActions.tankId }).from(capitalActions).where(eq(capitalActions.optionId, id))
    const measures = await costTanks(tx, actions.flatMap(a => (a.tankId ? [a.tankId] : [])))
    for (const a of actions) await tx.update(capitalActions).set({ cost: priceAction(after!, a.tankId ? measures.get(a.tankId) ?? null : null) }).where(eq(capitalActions.id, a.id))
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'update', entity: 'mitigation_option', entityId: id, before: { fixedCost: before.fixedCost, rate: before.rate, costBasis: before.costBasis, costStep: before.costStep }, after: body }, { tx, event })
    return { ...after!, actionsRepriced: actions.length }
  })
})
