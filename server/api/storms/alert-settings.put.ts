// PUT /api/storms/alert-settings — the organisation's alert threshold on a tank's ignition
// probability in a storm window (admins; null switches alerts off). Audited.
import { eq } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { stormAlertSettings } from '~~/server/db/schema'
import { stormAlertSettingsSchema } from '~~/shared/schemas/storms'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.admins })
  const input = await readValidBody(event, stormAlertSettingsSchema)
  return useDb().transaction(async (tx) => {
    const [before] = await tx.select().from(stormAlertSettings).where(eq(stormAlertSettings.organisationId, member.organisationId))
    if (input.ignitionThreshold === null) await tx.delete(stormAlertSettings).where(eq(stormAlertSettings.organisationId, member.organisationId))
    else {
      await tx.insert(stormAlertSettings).values({ organisationId: member.organisationId, ignitionThreshold: input.ignitionThreshold, updatedBy: member.user.id })
        .onConflictDoUpdate({ target: stormAlertSettings.organisationId, set: { ignitionThreshold: input.ignitionThreshold, updatedBy: member.user.id } })
    }
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'update', entity: 'storm_alert_setting', entityId: member.organisationId, before: { ignitionThreshold: before?.ignitionThreshold ?? null }, after: input }, { tx, event })
    return { ignitionThreshold: input.ignitionThreshold }
  })
})
