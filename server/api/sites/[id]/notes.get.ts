// GET /api/sites/:id/notes — the organisation's referral notes on a site it can read, newest first.
import { and, desc, eq } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { siteNotes, users } from '~~/server/db/schema'
import { findReadableSite } from '~~/server/inventory/access'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const { site } = await findReadableSite(member, readId(event, 'Site'))
  return useDb().select({ id: siteNotes.id, body: siteNotes.body, createdAt: siteNotes.createdAt, author: users.name })
    .from(siteNotes).leftJoin(users, eq(users.id, siteNotes.authorId))
    .where(and(eq(siteNotes.siteId, site.id), eq(siteNotes.organisationId, member.organisationId)))
    .orderBy(desc(siteNotes.createdAt))
})
