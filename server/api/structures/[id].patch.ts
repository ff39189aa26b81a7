// PATCH /api/structures/:id — replace a site structure's facts (the whole record).
import { eq } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { siteStructures } from '~~/server/db/schema'
import { structureSchema } from '~~/shared/schemas/inventory'
import { STRUCTURE_UNIQUE, findEditableStructure, rethrowUnique } from '~~/server/inventory/access'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const { structure: before } = await findEditableStructure(member, readId(event, 'Structure'))
  const body = await readValidBody(event, structureSchema)
  return useDb().transaction(async (tx) => {
    const [after] = await tx.update(siteStructures).set(body).where(eq(siteStructures.id, before.id)).returning()
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'update', entity: 'structure', entityId: before.id, before, after }, { tx, event })
    return after!
  }).catch(e => rethrowUnique(e, STRUCTURE_UNIQUE))
})
