// GET /api/audit/export?format=xlsx|csv&person=&entity=&from=&to= — the audit log with the screen's
// filters as a spreadsheet, one row per changed field (formula-safe). Admins; the export is audited.
import { auditExportQuerySchema } from '~~/shared/schemas/auth'
import { AUDIT_COLUMNS, auditExportRows, auditWorkbook } from '~~/server/accounts/audit-export'
import { fileDate } from '~~/server/utils/downloads'
import { sendCsv, sendWorkbook } from '~~/server/utils/sheets'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.admins })
  const { format, ...filters } = readValidQuery(event, auditExportQuerySchema)
  const name = `stormledger-audit-log-${fileDate()}.${format}`
  if (format === 'csv') {
    const { rows, events } = await auditExportRows(member.organisationId, filters)
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'export', entity: 'audit_log', entityId: null, after: { format, ...filters, events } }, { event })
    return sendCsv(event, name, AUDIT_COLUMNS, rows)
  }
  const { wb, events } = await auditWorkbook(member.organisationId, filters, { organisationName: member.organisationName, exportedBy: member.user.name })
  await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'export', entity: 'audit_log', entityId: null, after: { format, ...filters, events } }, { event })
  return sendWorkbook(event, wb, name)
})
