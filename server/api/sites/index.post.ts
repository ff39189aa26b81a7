// POST /api/sites — create a site in the caller's organisation; `portfolioIds` adds it to own portfolios.
import { and, eq, inArray } from 'drizzle-orm'
import { z } from 'zod'
import { useDb } from '~~/server/db'
import { portfolioSites, portfolios, sites } from '~~/server/db/schema'
import { siteSchema } from '~~/shared/schemas/inventory'
import { SITE_UNIQUE, rethrowUnique } from '~~/server/inventory/access'

const extra = z.object({ portfolioIds: z.array(z.uuid()).max(100).default([]) })

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const body = await readValidBody(event, siteSchema)
  const { portfolioIds } = await readValidBody(event, extra)
  const db = useDb()
  const own = portfolioIds.length === 0 ? [] : await db.select({ id: portfolios.id }).from(portfolios).where(and(inArray(portfolios.id, portfolioIds), eq(portfolios.organisationId, member.organisationId)))
  if (own.length !== new Set(portfolioIds).size) notFound('Portfolio')
  const created = await db.transaction(async (tx) => {
    const [site] = await tx.insert(sites).values({ ...body, organisationId: member.organisationId }).returning()
    if (own.length > 0) await tx.insert(portfolioSites).values(own.map(p => ({ portfolioId: p.id, siteId: site!.id })))
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'create', entity: 'site', entityId: site!.id, after: site }, { tx, event })
    return site!
  }).catch(e => rethrowUnique(e, SITE_UNIQUE))
  setResponseStatus(event, 201)
  return created
})
