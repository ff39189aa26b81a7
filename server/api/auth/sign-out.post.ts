// POST /api/auth/sign-out — ends this session: its record is revoked, so the cookie stops working
// wherever it was copied. Any member.
import { revokeSession } from '~~/server/accounts/sessions'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.everyone })
  if (member.sessionId) await revokeSession(member.sessionId)
  await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'sign_out', entity: 'account', entityId: member.user.id }, { event })
  await clearUserSession(event)
  return { ok: true }
})
