// GET /api/sites/:id/notes — the organisation's referrals on a site it can read, newest first, each
// with status, assignee, due date and its thread of replies.
import { siteReferrals } from '~~/server/referrals/referrals'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  return siteReferrals(member, readId(event, 'Site'))
})
