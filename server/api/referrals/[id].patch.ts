// PATCH /api/referrals/:id — change a referral's status, assignee or due date. Underwriters and admins
// change any of them; the person it is assigned to (any role but viewer) changes its status.
import { referralUpdateSchema } from '~~/shared/schemas/notes'
import { updateReferral } from '~~/server/referrals/referrals'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.contributors })
  const id = readId(event, 'Referral')
  const patch = await readValidBody(event, referralUpdateSchema)
  return updateReferral(event, member, id, patch)
})
