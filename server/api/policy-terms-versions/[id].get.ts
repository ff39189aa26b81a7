// GET /api/policy-terms-versions/:id — one terms version: its set, and a row per site of the
// portfolio (terms or null), plus rows kept for sites no longer in the portfolio, and its layers.
import { useDb } from '~~/server/db'
import { findTermsVersion, layersOf, versionRowsWithSites } from '~~/server/insurance/terms-store'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const id = readId(event, 'Terms version')
  const row = await findTermsVersion(useDb(), member.organisationId, id)
  if (!row) notFound('Terms version')
  return { ...row, currency: member.currency, ...(await versionRowsWithSites(row.version.id, row.set.portfolioId)), layers: await layersOf(useDb(), row.version.id) }
})
