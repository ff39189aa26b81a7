// GET /api/tanks/:id — one tank with its components and the site it stands on.
import { useDb } from '~~/server/db'
import { tanksWithComponents } from '~~/server/inventory/queries'
import { findReadableTank } from '~~/server/inventory/access'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const { tank, site, readOnly } = await findReadableTank(member, readId(event, 'Tank'))
  const [withComponents] = (await tanksWithComponents(useDb(), [site.id])).filter(t => t.id === tank.id)
  return { ...withComponents!, readOnly, site: { id: site.id, name: site.name, externalId: site.externalId, operatorName: site.operatorName } }
})
