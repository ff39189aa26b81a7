// DELETE /api/structures/:id — remove a site structure.
import { eq } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { siteStructures } from '~~/server/db/schema'
import { findEditableStructure } from '~~/server/inventory/access'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const { structure: before } = await findEditableStructure(member, readId(event, 'Structure'))
  await useDb().transaction(async (tx) => {
    await tx.delete(siteStructures).where(eq(siteStructures.id, before.id))
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'delete', entity: 'structure', entityId: before.id, before }, { tx, event })
  })
  return { deleted: true, siteId: before.siteId }
})
