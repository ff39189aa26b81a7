// POST /api/inventory/imports/:id/commit — write a previewed import in one transaction, or nothing
// ({ portfolioId } optionally adds every site of the file to one of the organisation's portfolios).
// Files above the background threshold answer 202 and are committed by the 'inventory.import' job.
import { z } from 'zod'
import { commitImport } from '~~/server/inventory/uploads'

const body = z.object({ portfolioId: z.uuid().nullable().default(null) })

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const id = readId(event, 'Import')
  const { portfolioId } = await readValidBody(event, body)
  const result = await commitImport(event, member, id, portfolioId)
  // A large file is committed by a background job: accepted, its progress on GET /api/inventory/imports/:id.
  if (result.status === 'committing') setResponseStatus(event, 202)
  return result
})
