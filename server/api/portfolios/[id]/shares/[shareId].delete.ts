// DELETE /api/portfolios/:id/shares/:shareId — stop sharing a portfolio with an organisation.
import { and, eq } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { portfolioShares } from '~~/server/db/schema'
import { findEditablePortfolio } from '~~/server/inventory/access'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.admins })
  const portfolio = await findEditablePortfolio(member, readId(event, 'Portfolio'))
  const shareId = readId(event, 'Share', 'shareId')
  await useDb().transaction(async (tx) => {
    const [gone] = await tx.delete(portfolioShares).where(and(eq(portfolioShares.id, shareId), eq(portfolioShares.portfolioId, portfolio.id))).returning()
    if (!gone) notFound('Share')
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'unshare', entity: 'portfolio', entityId: portfolio.id, before: gone }, { tx, event })
  })
  return { deleted: true }
})
