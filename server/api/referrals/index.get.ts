// GET /api/referrals?state=open|closed|all&mine=true — the organisation's referrals across every site
// it reads (open and in review by default), soonest due first, with their threads.
import { referralListQuerySchema } from '~~/shared/schemas/notes'
import { listReferrals } from '~~/server/referrals/referrals'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  return listReferrals(member, await readValidQuery(event, referralListQuerySchema))
})
