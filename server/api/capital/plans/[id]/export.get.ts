// GET /api/capital/plans/:id/export — the plan as a workbook, with the caution (everyone but viewers).
import { useDb } from '~~/server/db'
import { planDetail } from '~~/server/capital/plan-detail'
import { writePlanWorkbook } from '~~/server/capital/workbook'
import { fileDate } from '~~/server/utils/downloads'
import { sendWorkbook } from '~~/server/utils/sheets'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.exporters })
  const id = readId(event, 'Plan')
  const detail = await planDetail(useDb(), member.organisationId, id)
  if (!detail) notFound('Plan')
  const body = await writePlanWorkbook(detail, member.currency)
  await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'export', entity: 'capital_plan', entityId: id, after: { actions: detail.actions.length } }, { event })
  return sendWorkbook(event, body, `stormledger-capital-plan-${fileDate()}.xlsx`)
})
