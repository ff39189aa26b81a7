// GET /api/assumption-sets/:id — one set with every version (newest first).
import { findSet, listVersions } from '~~/server/assumptions/versions'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const id = readId(event, 'Assumption set')
  const set = await findSet(member.organisationId, id)
  if (!set) notFound('Assumption set')
  return { set, versions: await listVersions(set.id) }
})
