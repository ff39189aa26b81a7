// PUT /api/storms/alert-subscription — the caller asks for storm alerts by e-mail, or stops them. Audited.
import { and, eq } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { stormAlertSubscribers } from '~~/server/db/schema'
import { stormAlertSubscriptionSchema } from '~~/shared/schemas/storms'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.exporters })
  const input = await readValidBody(event, stormAlertSubscriptionSchema)
  return useDb().transaction(async (tx) => {
    if (input.subscribed) await tx.insert(stormAlertSubscribers).values({ organisationId: member.organisationId, userId: member.user.id }).onConflictDoNothing()
    else await tx.delete(stormAlertSubscribers).where(and(eq(stormAlertSubscribers.organisationId, member.organisationId), eq(stormAlertSubscribers.userId, member.user.id)))
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'update', entity: 'storm_alert_subscription', entityId: member.user.id, after: input }, { tx, event })
    return input
  })
})
