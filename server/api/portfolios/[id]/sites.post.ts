// POST /api/portfolios/:id/sites — add sites to and remove sites from a portfolio ({ add: [siteId], remove: [siteId] }).
import { and, eq, inArray } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { portfolioSites, sites } from '~~/server/db/schema'
import { portfolioSitesSchema } from '~~/shared/schemas/inventory'
import { findEditablePortfolio } from '~~/server/inventory/access'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const portfolio = await findEditablePortfolio(member, readId(event, 'Portfolio'))
  const body = await readValidBody(event, portfolioSitesSchema)
  const db = useDb()
  // A portfolio holds only its own organisation's sites.
  const own = body.add.length === 0 ? [] : await db.select({ id: sites.id }).from(sites).where(and(inArray(sites.id, body.add), eq(sites.organisationId, member.organisationId)))
  if (own.length !== new Set(body.add).size) notFound('Site')
  await db.transaction(async (tx) => {
    if (own.length > 0) await tx.insert(portfolioSites).values(own.map(s => ({ portfolioId: portfolio.id, siteId: s.id }))).onConflictDoNothing()
    if (body.remove.length > 0) await tx.delete(portfolioSites).where(and(eq(portfolioSites.portfolioId, portfolio.id), inArray(portfolioSites.siteId, body.remove)))
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'update', entity: 'portfolio_sites', entityId: portfolio.id, after: body }, { tx, event })
  })
  return { added: own.length, removed: body.remove.length }
})
