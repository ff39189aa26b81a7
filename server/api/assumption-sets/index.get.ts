// GET /api/assumption-sets — the organisation's assumption sets with their latest version.
import { desc, eq } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { assumptionSets, assumptionSetVersions } from '~~/server/db/schema'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const rows = await useDb().select({ set: assumptionSets, version: assumptionSetVersions }).from(assumptionSets)
    .leftJoin(assumptionSetVersions, eq(assumptionSetVersions.assumptionSetId, assumptionSets.id))
    .where(eq(assumptionSets.organisationId, member.organisationId))
    .orderBy(assumptionSets.name, desc(assumptionSetVersions.version))
  const sets = new Map<string, { id: string, name: string, description: string, versions: { id: string, version: number, usedByRun: boolean, note: string, createdAt: Date }[] }>()
  for (const { set, version } of rows) {
    const entry = sets.get(set.id) ?? { id: set.id, name: set.name, description: set.description, versions: [] }
    if (version) entry.versions.push({ id: version.id, version: version.version, usedByRun: version.usedByRun, note: version.note, createdAt: version.createdAt })
    sets.set(set.id, entry)
  }
  return [...sets.values()]
})
