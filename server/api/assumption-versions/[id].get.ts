// GET /api/assumption-versions/:id — one version's full parameters, with the set it belongs to.
import { findVersion } from '~~/server/assumptions/versions'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const id = readId(event, 'Assumption-set version')
  const row = await findVersion(member.organisationId, id)
  if (!row) notFound('Assumption-set version')
  return row
})
