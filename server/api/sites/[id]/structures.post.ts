// POST /api/sites/:id/structures — add a mast, stack, overhead ground wire support or building to a site.
import { useDb } from '~~/server/db'
import { siteStructures } from '~~/server/db/schema'
import { structureSchema } from '~~/shared/schemas/inventory'
import { STRUCTURE_UNIQUE, findEditableSite, rethrowUnique } from '~~/server/inventory/access'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const site = await findEditableSite(member, readId(event, 'Site'))
  const body = await readValidBody(event, structureSchema)
  const created = await useDb().transaction(async (tx) => {
    const [row] = await tx.insert(siteStructures).values({ ...body, siteId: site.id }).returning()
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'create', entity: 'structure', entityId: row!.id, after: row }, { tx, event })
    return row!
  }).catch(e => rethrowUnique(e, STRUCTURE_UNIQUE))
  setResponseStatus(event, 201)
  return created
})
