// When the app reads the session (GET /api/_auth/session, on every page load), check it against
// the database like requireMembership does, and add what the frame shows: the organisation, the
// current role and every membership. An ended session is cleared, so the pages send the person to
// sign-in instead of showing a frame whose every request would fail.
// Whenever a session cookie is cleared (sign-out, nuxt-auth-utils' own DELETE /api/_auth/session, an
// ended session), its record is revoked too, so a copy of the cookie stops working.
import { settings } from '../settings'
import { revokeSession } from '~~/server/accounts/sessions'

export default defineNitroPlugin(() => {
  sessionHooks.hook('clear', async (session) => {
    if (session.sessionId) await revokeSession(session.sessionId)
  })
  sessionHooks.hook('fetch', async (session, event) => {
    const member = await memberOfSession(session)
    if (!member) {
      await clearUserSession(event)
      throw createError({ statusCode: 401, statusMessage: 'Your session has ended. Sign in again.' })
    }
    session.user = { ...session.user!, name: member.user.name, email: member.user.email }
    session.role = member.role
    session.organisationName = member.organisationName
    session.organisationKind = member.organisationKind
    session.currency = member.currency
    session.memberships = await membershipsOf(member.user.id)
    session.mailboxEnabled = settings.mail.captured
  })
})
