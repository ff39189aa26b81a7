// GET /api/my-mail — messages the local mail fake caught for the signed-in person's own address
// (development, tests, demo), newest first. Any member; only ever one's own mail. With real SMTP
// configured nothing is caught: { enabled: false }.
import { settings } from '~~/server/settings'
import { readOwnMail } from '~~/server/accounts/mailbox'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.everyone })
  if (!settings.mail.captured) return { enabled: false, messages: [] }
  return { enabled: true, messages: await readOwnMail(member.user.email) }
})
