// PATCH /api/sites/:id — replace a site's facts (the whole record, as the form sends it).
import { eq } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { sites } from '~~/server/db/schema'
import { siteSchema } from '~~/shared/schemas/inventory'
import { SITE_UNIQUE, findEditableSite, rethrowUnique } from '~~/server/inventory/access'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const before = await findEditableSite(member, readId(event, 'Site'))
  const body = await readValidBody(event, siteSchema)
  return useDb().transaction(async (tx) => {
    const [after] = await tx.update(sites).set(body).where(eq(sites.id, before.id)).returning()
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'update', entity: 'site', entityId: before.id, before, after }, { tx, event })
    return after!
  }).catch(e => rethrowUnique(e, SITE_UNIQUE))
})
