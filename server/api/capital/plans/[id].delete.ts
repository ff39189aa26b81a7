// DELETE /api/capital/plans/:id — remove a saved plan (asset managers, admins).
import { and, eq } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { capitalPlans } from '~~/server/db/schema'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.planners })
  const id = readId(event, 'Plan')
  await useDb().transaction(async (tx) => {
    const [row] = await tx.delete(capitalPlans).where(and(eq(capitalPlans.id, id), eq(capitalPlans.organisationId, member.organisationId))).returning()
    if (!row) notFound('Plan')
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'delete', entity: 'capital_plan', entityId: id, before: { name: row.name, budget: row.budget } }, { tx, event })
  })
  setResponseStatus(event, 204)
  return null
})
