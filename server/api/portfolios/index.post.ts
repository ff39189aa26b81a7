// POST /api/portfolios — create a portfolio in the caller's organisation.
import { useDb } from '~~/server/db'
import { portfolios } from '~~/server/db/schema'
import { portfolioSchema } from '~~/shared/schemas/inventory'
import { PORTFOLIO_UNIQUE, rethrowUnique } from '~~/server/inventory/access'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const body = await readValidBody(event, portfolioSchema)
  const created = await useDb().transaction(async (tx) => {
    const [row] = await tx.insert(portfolios).values({ ...body, organisationId: member.organisationId }).returning()
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'create', entity: 'portfolio', entityId: row!.id, after: row }, { tx, event })
    return row!
  }).catch(e => rethrowUnique(e, PORTFOLIO_UNIQUE))
  setResponseStatus(event, 201)
  return created
})
