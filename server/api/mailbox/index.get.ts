// GET /api/mailbox — messages caught by the local mail fake (development, tests, demo) that were sent
// to the organisation's members or to addresses it invited, newest first. Admins. With real SMTP
// configured nothing is caught: { enabled: false }.
import { settings } from '~~/server/settings'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.admins })
  if (!settings.mail.captured) return { enabled: false, messages: [] }
  return { enabled: true, messages: await readMailbox(member.organisationId) }
})
