// GET /api/audit?person=&entity=&from=&to=&page= — the organisation's audit log, newest first,
// filtered by person, entity and date (UTC days, inclusive). Admins.
import { auditQuerySchema } from '~~/shared/schemas/auth'
import { readAuditLog } from '~~/server/accounts/audit-log'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.admins })
  const query = readValidQuery(event, auditQuerySchema)
  return await readAuditLog(member.organisationId, query)
})
