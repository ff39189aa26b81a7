// GET /api/portfolios — the organisation's portfolios and those shared with it read-only, with site counts.
import { asc, eq, inArray, or, sql } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { organisations, portfolioShares, portfolios } from '~~/server/db/schema'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const db = useDb()
  const rows = await db.select({
    id: portfolios.id, name: portfolios.name, description: portfolios.description, organisationId: portfolios.organisationId,
    ownerName: organisations.name, updatedAt: portfolios.updatedAt,
    siteCount: sql<number>`(SELECT count(*)::int FROM portfolio_sites ps WHERE ps.portfolio_id = "portfolios"."id")`,
  }).from(portfolios).innerJoin(organisations, eq(organisations.id, portfolios.organisationId))
    .where(or(eq(portfolios.organisationId, member.organisationId), inArray(portfolios.id, db.select({ id: portfolioShares.portfolioId }).from(portfolioShares).where(eq(portfolioShares.organisationId, member.organisationId)))))
    .orderBy(asc(portfolios.name))
  return rows.map(({ organisationId, ...p }) => ({ ...p, readOnly: organisationId !== member.organisationId }))
})
