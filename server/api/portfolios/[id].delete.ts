// DELETE /api/portfolios/:id — remove a portfolio and its shares; its sites stay in the inventory.
import { eq } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { portfolios } from '~~/server/db/schema'
import { findEditablePortfolio } from '~~/server/inventory/access'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const before = await findEditablePortfolio(member, readId(event, 'Portfolio'))
  await useDb().transaction(async (tx) => {
    await tx.delete(portfolios).where(eq(portfolios.id, before.id))
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'delete', entity: 'portfolio', entityId: before.id, before }, { tx, event })
  })
  return { deleted: true }
})
