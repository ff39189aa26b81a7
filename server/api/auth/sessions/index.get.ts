// GET /api/auth/sessions — the signed-in person's open sessions (started, last seen, browser,
// address), the current one marked. Any member; only ever one's own.
import { listOpenSessions } from '~~/server/accounts/sessions'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.everyone })
  const sessions = await listOpenSessions(member.user.id)
  return { sessions: sessions.map(s => ({ ...s, current: s.id === member.sessionId })) }
})
