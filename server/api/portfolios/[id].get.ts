// GET /api/portfolios/:id — one portfolio (own or shared read-only) with its shares when it is the caller's.
import { asc, eq } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { organisations, portfolioShares } from '~~/server/db/schema'
import { findReadablePortfolio } from '~~/server/inventory/access'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const id = readId(event, 'Portfolio')
  const { portfolio, ownerName, readOnly } = await findReadablePortfolio(member, id)
  const shares = readOnly ? [] : await useDb().select({ id: portfolioShares.id, organisationId: portfolioShares.organisationId, organisationName: organisations.name, createdAt: portfolioShares.createdAt })
    .from(portfolioShares).innerJoin(organisations, eq(organisations.id, portfolioShares.organisationId))
    .where(eq(portfolioShares.portfolioId, id)).orderBy(asc(organisations.name))
  return { ...portfolio, ownerName, readOnly, shares }
})
