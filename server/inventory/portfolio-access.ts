// Which portfolio an organisation may read: its own, or one another organisation shared with it.
// Framework-free (the run starter uses it from scripts too); routes use `findReadablePortfolio`
// (server/inventory/access.ts), which answers 404 when this returns null.
import { and, eq, inArray, or } from 'drizzle-orm'
import { useDb } from '../db'
import { organisations, portfolioShares, portfolios } from '../db/schema'

export interface ReadablePortfolio {
  portfolio: typeof portfolios.$inferSelect
  ownerName: string
  /** Shared with the organisation read-only (another organisation owns it). */
  readOnly: boolean
}

export async function readablePortfolio(organisationId: string, portfolioId: string): Promise<ReadablePortfolio | null> {
  const [row] = await useDb().select({ portfolio: portfolios, ownerName: organisations.name }).from(portfolios)
    .innerJoin(organisations, eq(organisations.id, portfolios.organisationId))
    .where(and(eq(portfolios.id, portfolioId), or(
      eq(portfolios.organisationId, organisationId),
      inArray(portfolios.id, useDb().select({ id: portfolioShares.portfolioId }).from(portfolioShares).where(eq(portfolioShares.organisationId, organisationId))),
    )))
  return row ? { ...row, readOnly: row.portfolio.organisationId !== organisationId } : null
}
