// GET /api/storms/feeds — the organisation's storm feeds (never their tokens).
import { desc, eq } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { stormFeeds } from '~~/server/db/schema'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.admins })
  return useDb().select({ id: stormFeeds.id, name: stormFeeds.name, tokenHint: stormFeeds.tokenHint, createdAt: stormFeeds.createdAt, revokedAt: stormFeeds.revokedAt })
    .from(stormFeeds).where(eq(stormFeeds.organisationId, member.organisationId)).orderBy(desc(stormFeeds.createdAt))
})
