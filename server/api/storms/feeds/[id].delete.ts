// DELETE /api/storms/feeds/:id — revoke a feed: its token stops working at once; its batches stay.
import { and, eq, isNull } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { stormFeeds } from '~~/server/db/schema'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.admins })
  const id = readId(event, 'Storm feed')
  return useDb().transaction(async (tx) => {
    const [row] = await tx.update(stormFeeds).set({ revokedAt: new Date() })
      .where(and(eq(stormFeeds.id, id), eq(stormFeeds.organisationId, member.organisationId), isNull(stormFeeds.revokedAt))).returning({ id: stormFeeds.id, name: stormFeeds.name })
    if (!row) notFound('Storm feed')
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'delete', entity: 'storm_feed', entityId: id, before: { name: row.name } }, { tx, event })
    return { id, revoked: true }
  })
})
