// POST /api/whatif-options/:id/send — make a saved what-if option a candidate action of the capital
// plan with a catalogue option, in one step (asset managers, admins: the capital plan's own rule); audited.
import { sendWhatIfOptionSchema } from '~~/shared/schemas/whatif'
import { sendWhatIfOption } from '~~/server/whatif/options'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.planners })
  const id = readId(event, 'Saved option')
  const { optionId } = await readValidBody(event, sendWhatIfOptionSchema)
  const sent = await sendWhatIfOption(id, optionId, { organisationId: member.organisationId, userId: member.user.id }, event)
  setResponseStatus(event, 201)
  return sent
})
