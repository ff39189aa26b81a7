// GET /api/auth/session — who is signed in: the person, the current organisation and role, and every
// organisation they belong to. Any member.
import { settings } from '~~/server/settings'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.everyone })
  return {
    user: member.user,
    organisation: { id: member.organisationId, name: member.organisationName, kind: member.organisationKind, currency: member.currency },
    role: member.role,
    memberships: await membershipsOf(member.user.id),
    mailboxEnabled: settings.mail.captured,
  }
})
