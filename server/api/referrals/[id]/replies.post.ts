// POST /api/referrals/:id/replies — a reply in a referral's thread (every member but viewers).
import { referralReplySchema } from '~~/shared/schemas/notes'
import { addReply } from '~~/server/referrals/referrals'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.contributors })
  const id = readId(event, 'Referral')
  const { body } = await readValidBody(event, referralReplySchema)
  const reply = await addReply(event, member, id, body)
  setResponseStatus(event, 201)
  return reply
})
