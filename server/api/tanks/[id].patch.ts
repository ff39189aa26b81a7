// PATCH /api/tanks/:id — replace a tank's facts and components (the whole record, as the form sends it).
import { eq } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { tankComponents, tanks } from '~~/server/db/schema'
import { tankSchema } from '~~/shared/schemas/inventory'
import { TANK_UNIQUE, findEditableTank, rethrowUnique } from '~~/server/inventory/access'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const { tank: before } = await findEditableTank(member, readId(event, 'Tank'))
  const { components, ...tank } = await readValidBody(event, tankSchema)
  return useDb().transaction(async (tx) => {
    const [after] = await tx.update(tanks).set(tank).where(eq(tanks.id, before.id)).returning()
    await tx.delete(tankComponents).where(eq(tankComponents.tankId, before.id))
    if (components.length > 0) await tx.insert(tankComponents).values(components.map(c => ({ ...c, tankId: before.id })))
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'update', entity: 'tank', entityId: before.id, before, after: { ...after, components } }, { tx, event })
    return { ...after!, components }
  }).catch(e => rethrowUnique(e, TANK_UNIQUE))
})
