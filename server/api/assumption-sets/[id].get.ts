// GET /api/assumption-sets/:id — one set with every version (newest first).
import { uuidParams } from '~~/shared/schemas/assumptions'
import { findSet, listVersions } from '~~/server/assumptions/versions'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const { id } = readValidParams(event, uuidParams)
  const set = await findSet(member.organisationId, id)
  if (!set) notFound('Assumption set')
  return { set, versions: await listVersions(set.id) }
})
