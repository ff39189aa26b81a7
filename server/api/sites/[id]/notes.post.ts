// POST /api/sites/:id/notes — an underwriter's (or admin's) referral on a site, with author and time,
// optionally given to a member of the organisation (who is e-mailed) and due on a day.
import { siteNoteSchema } from '~~/shared/schemas/notes'
import { createReferral } from '~~/server/referrals/referrals'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.underwriting })
  const siteId = readId(event, 'Site')
  const input = await readValidBody(event, siteNoteSchema)
  const note = await createReferral(event, member, siteId, input)
  setResponseStatus(event, 201)
  return note
})
