// POST /api/capital/options — add an option to the catalogue (asset managers, admins).
import { createOptionSchema } from '~~/shared/schemas/capital'
import { useDb } from '~~/server/db'
import { mitigationOptions } from '~~/server/db/schema'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.planners })
  const body = await readValidBody(event, createOptionSchema)
  const option = await useDb().transaction(async (tx) => {
    const [row] = await tx.insert(mitigationOptions).values({ ...body, organisationId: member.organisationId }).onConflictDoNothing().returning()
    if (!row) conflict(`An option named "${body.name}" exists already.`)
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'create', entity: 'mitigation_option', entityId: row.id, after: body }, { tx, event })
    return row
  })
  setResponseStatus(event, 201)
  return option
})
