// POST /api/auth/sessions/sign-out-everywhere — revokes every session of the signed-in person,
// this one included, on every device. Any member; audited.
import { useDb } from '~~/server/db'
import { revokeUserSessions } from '~~/server/accounts/sessions'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.everyone })
  const ended = await useDb().transaction(async (tx) => {
    const n = await revokeUserSessions(member.user.id, { executor: tx })
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'sign_out_everywhere', entity: 'account', entityId: member.user.id, after: { sessionsEnded: n } }, { tx, event })
    return n
  })
  await clearUserSession(event)
  return { ok: true, sessionsEnded: ended }
})
