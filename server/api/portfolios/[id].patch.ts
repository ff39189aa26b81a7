// PATCH /api/portfolios/:id — rename or redescribe a portfolio (the whole record, as the form sends it).
import { eq } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { portfolios } from '~~/server/db/schema'
import { portfolioSchema } from '~~/shared/schemas/inventory'
import { PORTFOLIO_UNIQUE, findEditablePortfolio, rethrowUnique } from '~~/server/inventory/access'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const before = await findEditablePortfolio(member, readId(event, 'Portfolio'))
  const body = await readValidBody(event, portfolioSchema)
  return useDb().transaction(async (tx) => {
    const [after] = await tx.update(portfolios).set(body).where(eq(portfolios.id, before.id)).returning()
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'update', entity: 'portfolio', entityId: before.id, before, after }, { tx, event })
    return after!
  }).catch(e => rethrowUnique(e, PORTFOLIO_UNIQUE))
})
