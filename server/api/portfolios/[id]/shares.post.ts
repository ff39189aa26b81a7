// POST /api/portfolios/:id/shares — share a portfolio read-only with another organisation, named exactly.
import { eq } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { organisations, portfolioShares } from '~~/server/db/schema'
import { portfolioShareSchema } from '~~/shared/schemas/inventory'
import { findEditablePortfolio } from '~~/server/inventory/access'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.admins })
  const portfolio = await findEditablePortfolio(member, readId(event, 'Portfolio'))
  const body = await readValidBody(event, portfolioShareSchema)
  const db = useDb()
  const [target] = await db.select({ id: organisations.id, name: organisations.name }).from(organisations).where(eq(organisations.name, body.organisationName))
  if (!target) notFound('Organisation')
  if (target.id === member.organisationId) badRequest('A portfolio is already visible to your own organisation; choose another organisation.')
  const share = await db.transaction(async (tx) => {
    const [row] = await tx.insert(portfolioShares).values({ portfolioId: portfolio.id, organisationId: target.id, grantedBy: member.user.id }).onConflictDoNothing().returning()
    if (!row) conflict(`The portfolio is already shared with ${target.name}.`)
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'share', entity: 'portfolio', entityId: portfolio.id, after: { sharedWith: target.name } }, { tx, event })
    return row
  })
  setResponseStatus(event, 201)
  return { ...share, organisationName: target.name }
})
