// DELETE /api/sites/:id — remove a site with its tanks, their components and its structures; portfolios lose it.
import { count, eq } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { siteStructures, sites, tanks } from '~~/server/db/schema'
import { findEditableSite } from '~~/server/inventory/access'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const before = await findEditableSite(member, readId(event, 'Site'))
  return useDb().transaction(async (tx) => {
    const [[t], [s]] = await Promise.all([
      tx.select({ n: count() }).from(tanks).where(eq(tanks.siteId, before.id)),
      tx.select({ n: count() }).from(siteStructures).where(eq(siteStructures.siteId, before.id)),
    ])
    await tx.delete(sites).where(eq(sites.id, before.id))
    const removed = { tanks: t!.n, structures: s!.n }
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'delete', entity: 'site', entityId: before.id, before: { ...before, removed } }, { tx, event })
    return { deleted: true, removed }
  })
})
