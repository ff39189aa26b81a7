// GET /api/sites — one page of the sites the caller may read (own and shared), sorted and filtered on the server.
import { useDb } from '~~/server/db'
import { listSites } from '~~/server/inventory/queries'
import { siteListQuerySchema } from '~~/shared/schemas/inventory'
import { findReadablePortfolio, readableSites } from '~~/server/inventory/access'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const query = readValidQuery(event, siteListQuerySchema)
  if (query.portfolioId) await findReadablePortfolio(member, query.portfolioId)
  return listSites(useDb(), member.organisationId, readableSites(member.organisationId), query)
})
