// POST /api/assumption-sets — a new named set; version 1 holds the defaults plus the given changes.
import { assumptionSetCreateSchema } from '~~/shared/schemas/assumptions'
import { useDb } from '~~/server/db'
import { assumptionSets } from '~~/server/db/schema'
import { addVersion, mergeParameters } from '~~/server/assumptions/versions'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const body = await readValidBody(event, assumptionSetCreateSchema)
  return await useDb().transaction(async (tx) => {
    const [set] = await tx.insert(assumptionSets).values({
      organisationId: member.organisationId, name: body.name, description: body.description, createdBy: member.user.id,
    }).onConflictDoNothing().returning()
    if (!set) conflict(`An assumption set named "${body.name}" exists already.`)
    const version = await addVersion(tx, set.id, member.user.id, { parameters: mergeParameters(null, body.parameters), note: body.note || 'First version' })
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'create', entity: 'assumption_set', entityId: set.id, after: { name: set.name, version: 1 } }, { tx, event })
    return { set, version }
  })
})
