// POST /api/whatif-options — keep a what-if option for the organisation (everyone but viewers); audited.
import { saveWhatIfOptionSchema } from '~~/shared/schemas/whatif'
import { saveWhatIfOption } from '~~/server/whatif/options'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.contributors })
  const body = await readValidBody(event, saveWhatIfOptionSchema)
  const saved = await saveWhatIfOption(body, { organisationId: member.organisationId, userId: member.user.id }, event)
  setResponseStatus(event, 201)
  return saved
})
