// DELETE /api/capital/actions/:id — withdraw a candidate action (asset managers, admins).
import { and, eq } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { capitalActions } from '~~/server/db/schema'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.planners })
  const id = readId(event, 'Action')
  await useDb().transaction(async (tx) => {
    const [row] = await tx.delete(capitalActions).where(and(eq(capitalActions.id, id), eq(capitalActions.organisationId, member.organisationId))).returning()
    if (!row) notFound('Action')
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'delete', entity: 'capital_action', entityId: id, before: { option: row.optionId, tank: row.tankId, cost: row.cost } }, { tx, event })
  })
  setResponseStatus(event, 204)
  return null
})
