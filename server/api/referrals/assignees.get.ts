// GET /api/referrals/assignees — the members a referral may be given to (underwriters and admins choose).
import { assignableMembers } from '~~/server/referrals/referrals'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.underwriting })
  return assignableMembers(member.organisationId)
})
