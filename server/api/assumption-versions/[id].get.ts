// GET /api/assumption-versions/:id — one version's full parameters, with the set it belongs to.
import { uuidParams } from '~~/shared/schemas/assumptions'
import { findVersion } from '~~/server/assumptions/versions'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const { id } = readValidParams(event, uuidParams)
  const row = await findVersion(member.organisationId, id)
  if (!row) notFound('Assumption-set version')
  return row
})
