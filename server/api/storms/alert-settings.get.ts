// GET /api/storms/alert-settings — the organisation's alert threshold and whether the caller asked for alerts.
import { and, eq } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { stormAlertSettings, stormAlertSubscribers } from '~~/server/db/schema'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.exporters })
  const db = useDb()
  const [setting] = await db.select().from(stormAlertSettings).where(eq(stormAlertSettings.organisationId, member.organisationId))
  const [mine] = await db.select().from(stormAlertSubscribers).where(and(eq(stormAlertSubscribers.organisationId, member.organisationId), eq(stormAlertSubscribers.userId, member.user.id)))
  return { ignitionThreshold: setting?.ignitionThreshold ?? null, subscribed: Boolean(mine), mayEditThreshold: member.role === 'admin' }
})
