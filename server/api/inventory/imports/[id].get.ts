// GET /api/inventory/imports/:id — a stored import: its counts, row errors, status and commit progress (without the file bytes).
import { and, eq } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { inventoryImports } from '~~/server/db/schema'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const id = readId(event, 'Import')
  const [record] = await useDb().select({
    id: inventoryImports.id, fileName: inventoryImports.fileName, sizeBytes: inventoryImports.sizeBytes, status: inventoryImports.status,
    summary: inventoryImports.summary, errors: inventoryImports.errors, createdAt: inventoryImports.createdAt, committedAt: inventoryImports.committedAt,
    progress: inventoryImports.progress, failureMessage: inventoryImports.failureMessage,
  }).from(inventoryImports).where(and(eq(inventoryImports.id, id), eq(inventoryImports.organisationId, member.organisationId)))
  return record ?? notFound('Import')
})
