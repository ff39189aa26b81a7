// GET /api/sites/:id — one site with its tanks (and their components), structures and portfolios.
import { useDb } from '~~/server/db'
import { siteDetail } from '~~/server/inventory/queries'
import { findReadableSite } from '~~/server/inventory/access'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const { site } = await findReadableSite(member, readId(event, 'Site'))
  return (await siteDetail(useDb(), site.id, member.organisationId)) ?? notFound('Site')
})
