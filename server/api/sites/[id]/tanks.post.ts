// POST /api/sites/:id/tanks — add a tank (with its internal components) to a site.
import { useDb } from '~~/server/db'
import { tankComponents, tanks } from '~~/server/db/schema'
import { tankSchema } from '~~/shared/schemas/inventory'
import { TANK_UNIQUE, findEditableSite, rethrowUnique } from '~~/server/inventory/access'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const site = await findEditableSite(member, readId(event, 'Site'))
  const { components, ...tank } = await readValidBody(event, tankSchema)
  const created = await useDb().transaction(async (tx) => {
    const [row] = await tx.insert(tanks).values({ ...tank, siteId: site.id }).returning()
    if (components.length > 0) await tx.insert(tankComponents).values(components.map(c => ({ ...c, tankId: row!.id })))
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'create', entity: 'tank', entityId: row!.id, after: { ...row, components } }, { tx, event })
    return { ...row!, components }
  }).catch(e => rethrowUnique(e, TANK_UNIQUE))
  setResponseStatus(event, 201)
  return created
})
