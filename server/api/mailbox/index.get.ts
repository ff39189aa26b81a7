// GET /api/mailbox — messages caught by the local mail fake (development, tests, demo) that this
// organisation sent (invitations, run notices), newest first; never personal mail. Admins. With real SMTP
// configured nothing is caught: { enabled: false }.
import { settings } from '~~/server/settings'
import { readMailbox } from '~~/server/accounts/mailbox'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.admins })
  if (!settings.mail.captured) return { enabled: false, messages: [] }
  return { enabled: true, messages: await readMailbox(member.organisationId) }
})
