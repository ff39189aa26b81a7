// PATCH /api/assumption-versions/:id — change values. A version no run has used changes in place;
// a used version stays as it is and the changes become the set's next version.
import { eq } from 'drizzle-orm'
import { assumptionVersionEditSchema } from '~~/shared/schemas/assumptions'
import { parseAssumptions } from '~~/shared/engine/assumptions'
import { useDb } from '~~/server/db'
import { assumptionSetVersions } from '~~/server/db/schema'
import { addVersion, findVersion, mergeParameters } from '~~/server/assumptions/versions'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const id = readId(event, 'Assumption-set version')
  const body = await readValidBody(event, assumptionVersionEditSchema)
  const row = await findVersion(member.organisationId, id)
  if (!row) notFound('Assumption-set version')
  const merged = mergeParameters(row.version.parameters, body.parameters)
  return await useDb().transaction(async (tx) => {
    // Re-read under lock: a run may have started with this version meanwhile.
    const [current] = await tx.select().from(assumptionSetVersions).where(eq(assumptionSetVersions.id, id)).for('update')
    if (current!.usedByRun) {
      const version = await addVersion(tx, row.set.id, member.user.id, { parameters: merged, note: body.note || `Edited from version ${current!.version}` })
      await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'create', entity: 'assumption_version', entityId: version.id, before: { version: current!.version }, after: { version: version.version, changes: body.parameters } }, { tx, event })
      return { version, createdNewVersion: true }
    }
    const [version] = await tx.update(assumptionSetVersions).set({ parameters: parseAssumptions(merged), note: body.note || current!.note })
      .where(eq(assumptionSetVersions.id, id)).returning()
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'update', entity: 'assumption_version', entityId: id, before: current!.parameters, after: version!.parameters }, { tx, event })
    return { version: version!, createdNewVersion: false }
  })
})
