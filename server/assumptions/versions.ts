// LOCAL COPY of the lead's module (server/assumptions/versions.ts), written against its published
// signatures so calibration compiles before the merge; the lead's file replaces it.
import { and, desc, eq, max } from 'drizzle-orm'
import { deepMerge, defaultAssumptions, parseAssumptions } from '../../shared/engine/assumptions'
import { useDb, type Database } from '../db'
import { assumptionSets, assumptionSetVersions } from '../db/schema'

export async function findSet(organisationId: string, setId: string) {
  const [set] = await useDb().select().from(assumptionSets).where(and(eq(assumptionSets.id, setId), eq(assumptionSets.organisationId, organisationId)))
  return set ?? null
}

export async function findVersion(organisationId: string, versionId: string) {
  const [row] = await useDb().select({ version: assumptionSetVersions, set: assumptionSets })
    .from(assumptionSetVersions)
    .innerJoin(assumptionSets, eq(assumptionSets.id, assumptionSetVersions.assumptionSetId))
    .where(and(eq(assumptionSetVersions.id, versionId), eq(assumptionSets.organisationId, organisationId)))
  return row ?? null
}

export async function listVersions(setId: string) {
  return useDb().select().from(assumptionSetVersions).where(eq(assumptionSetVersions.assumptionSetId, setId)).orderBy(desc(assumptionSetVersions.version))
}

/** A database or an open transaction (callers write the version inside their own transaction). */
export type Executor = Pick<Database, 'select' | 'insert'>

export interface NewVersion { parameters: unknown, note: string, provenance?: Record<string, unknown> }

export async function addVersion(tx: Executor, setId: string, userId: string | null, input: NewVersion) {
  const parameters = parseAssumptions(input.parameters)
  const [{ latest }] = await tx.select({ latest: max(assumptionSetVersions.version) }).from(assumptionSetVersions).where(eq(assumptionSetVersions.assumptionSetId, setId)) as [{ latest: number | null }]
  const [version] = await tx.insert(assumptionSetVersions).values({
    assumptionSetId: setId, version: (latest ?? 0) + 1, parameters, note: input.note, provenance: input.provenance ?? {}, createdBy: userId,
  }).returning()
  return version!
}

export function mergeParameters(base: unknown, changes: unknown): unknown {
  return deepMerge(base ?? defaultAssumptions, changes)
}
