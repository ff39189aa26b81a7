// DELETE /api/tanks/:id — remove a tank and its components.
import { eq } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { tanks } from '~~/server/db/schema'
import { findEditableTank } from '~~/server/inventory/access'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const { tank: before } = await findEditableTank(member, readId(event, 'Tank'))
  await useDb().transaction(async (tx) => {
    await tx.delete(tanks).where(eq(tanks.id, before.id))
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'delete', entity: 'tank', entityId: before.id, before }, { tx, event })
  })
  return { deleted: true, siteId: before.siteId }
})
