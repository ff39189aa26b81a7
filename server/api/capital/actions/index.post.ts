// POST /api/capital/actions — propose actions: an option on chosen tanks, on every tank matching a filter, or a mast on a site (asset managers, admins).
import { createActionsSchema } from '~~/shared/schemas/capital'
import { useDb } from '~~/server/db'
import { createActions } from '~~/server/capital/create-actions'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.planners })
  const body = await readValidBody(event, createActionsSchema)
  const created = await useDb().transaction(async (tx) => {
    const rows = await createActions(tx, member.organisationId, member.user.id, body)
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'create', entity: 'capital_action', entityId: rows[0]?.id ?? null, after: { option: body.optionId, added: rows.length, filter: body.filter ?? null } }, { tx, event })
    return rows
  })
  setResponseStatus(event, 201)
  return { added: created.length, actions: created }
})
