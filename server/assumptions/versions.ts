// Assumption sets and their versions. A version a run has used never changes: editing it creates
// the next version, so every run's assumptions stay exactly as they were.
import { and, desc, eq, max } from 'drizzle-orm'
import { deepMerge, defaultAssumptions, parseAssumptions } from '../../shared/engine/assumptions'
import { useDb, type Database } from '../db'
import { assumptionSets, assumptionSetVersions } from '../db/schema'

export async function findSet(organisationId: string, setId: string) {
  const [set] = await useDb().select().from(assumptionSets)
    .where(and(eq(assumptionSets.id, setId), eq(assumptionSets.organisationId, organisationId)))
  return set ?? null
}

export async function findVersion(organisationId: string, versionId: string) {
  const [row] = await useDb().select({ version: assumptionSetVersions, set: assumptionSets }).from(assumptionSetVersions)
    .innerJoin(assumptionSets, eq(assumptionSets.id, assumptionSetVersions.assumptionSetId))
    .where(and(eq(assumptionSetVersions.id, versionId), eq(assumptionSets.organisationId, organisationId)))
  return row ?? null
}

export async function listVersions(setId: string) {
  return useDb().select().from(assumptionSetVersions)
    .where(eq(assumptionSetVersions.assumptionSetId, setId)).orderBy(desc(assumptionSetVersions.version))
}

export interface NewVersion { parameters: unknown, note: string, provenance?: Record<string, unknown> }

/** Adds the next version of a set (validated against the engine's schema). */
export async function addVersion(tx: Pick<Database, 'select' | 'insert'>, setId: string, userId: string | null, input: NewVersion) {
  const parameters = parseAssumptions(input.parameters)
  const [{ latest } = { latest: 0 }] = await tx.select({ latest: max(assumptionSetVersions.version) }).from(assumptionSetVersions)
    .where(eq(assumptionSetVersions.assumptionSetId, setId))
  const [version] = await tx.insert(assumptionSetVersions).values({
    assumptionSetId: setId, version: (latest ?? 0) + 1, parameters, note: input.note,
    provenance: input.provenance ?? {}, createdBy: userId,
  }).returning()
  return version!
}

/** A full parameter object from changes over a base (the engine defaults when no base). */
export function mergeParameters(base: unknown, changes: unknown): unknown {
  return deepMerge(base ?? defaultAssumptions, changes)
}
