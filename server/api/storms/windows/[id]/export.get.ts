// GET /api/storms/windows/:id/export — the storm report as a workbook (provenance and the caution); audited.
import { stormReport } from '~~/server/storms/report'
import { writeStormWorkbook } from '~~/server/storms/workbook'
import { settings } from '~~/server/settings'
import { sendWorkbook } from '~~/server/utils/sheets'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.exporters })
  const report = await stormReport(member, readId(event, 'Storm window'))
  const buffer = await writeStormWorkbook(report, { exportedBy: member.user.email, publicUrl: settings.publicUrl })
  await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'export', entity: 'storm_window', entityId: report.window.id, after: { tanks: report.tanks.length } }, { event })
  return sendWorkbook(event, buffer, `storm-${report.window.startsAt.slice(0, 10)}-${report.window.id.slice(0, 8)}.xlsx`)
})
