// GET /api/runs/:id/financial-workbook — the financial view as a workbook (Summary with cautions and
// provenance, Sites, Premium, Exceedance), with the same query as the view.
import { financialQuerySchema } from '~~/shared/schemas/insurance'
import { financialView, loadFinancialInputs } from '~~/server/insurance/financial-view'
import { writeFinancialWorkbook } from '~~/server/insurance/workbook'
import { sendWorkbook } from '~~/server/utils/sheets'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.exporters })
  const id = readId(event, 'Results of this run')
  const query = readValidQuery(event, financialQuerySchema)
  const view = financialView(await loadFinancialInputs(member.organisationId, id, query.termsVersionId), { ...query, whatIfOccurrenceDeductible: undefined, whatIfAggregateDeductible: undefined })
  const body = await writeFinancialWorkbook(view, { currency: member.currency, exportedBy: `${member.user.name} <${member.user.email}>`, exportedAt: new Date() })
  await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'export', entity: 'financial_results', entityId: id, after: { termsVersionId: view.terms?.versionId ?? null, pricing: view.pricing } }, { event })
  return sendWorkbook(event, body, `stormledger-financial-${id.slice(0, 8)}.xlsx`)
})
