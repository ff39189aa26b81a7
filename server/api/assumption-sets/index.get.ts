// GET /api/assumption-sets?archived=hide|include|only — the organisation's assumption sets with their versions (archived sets hidden by default).
import { and, desc, eq } from 'drizzle-orm'
import { archivedQuerySchema } from '~~/shared/schemas/archive'
import { archivedFilter } from '~~/server/archive/records'
import { useDb } from '~~/server/db'
import { assumptionSets, assumptionSetVersions } from '~~/server/db/schema'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const { archived } = readValidQuery(event, archivedQuerySchema)
  const rows = await useDb().select({ set: assumptionSets, version: assumptionSetVersions }).from(assumptionSets)
    .leftJoin(assumptionSetVersions, eq(assumptionSetVersions.assumptionSetId, assumptionSets.id))
    .where(and(eq(assumptionSets.organisationId, member.organisationId), archivedFilter(assumptionSets.archivedAt, archived)))
    .orderBy(assumptionSets.name, desc(assumptionSetVersions.version))
  const sets = new Map<string, { id: string, name: string, description: string, archivedAt: Date | null, versions: { id: string, version: number, usedByRun: boolean, note: string, createdAt: Date }[] }>()
  for (const { set, version } of rows) {
    const entry = sets.get(set.id) ?? { id: set.id, name: set.name, description: set.description, archivedAt: set.archivedAt, versions: [] }
    if (version) entry.versions.push({ id: version.id, version: version.version, usedByRun: version.usedByRun, note: version.note, createdAt: version.createdAt })
    sets.set(set.id, entry)
  }
  return [...sets.values()]
})
