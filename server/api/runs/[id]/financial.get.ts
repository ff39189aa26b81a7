// GET /api/runs/:id/financial — the financial view of a succeeded simulated-years run: ground-up,
// after-terms and insured losses per site and for the portfolio, exceedance, the sites behind the
// tail and the technical premium; with whatIf* query values, the same figures with changed
// deductibles, from the stored events (no new simulation).
import { financialQuerySchema } from '~~/shared/schemas/insurance'
import { financialView, loadFinancialInputs } from '~~/server/insurance/financial-view'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const id = readId(event, 'Results of this run')
  const query = readValidQuery(event, financialQuerySchema)
  const inputs = await loadFinancialInputs(member.organisationId, id, query.termsVersionId)
  return { currency: member.currency, ...financialView(inputs, query) }
})
