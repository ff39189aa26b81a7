// Archive, restore and delete for the organisation's reusable records: assumption sets,
// calibrations, mitigation options and policy-terms sets. Archiving hides a record from lists and
// pickers and keeps it for whatever used it; deleting removes it for good. Both are refused, with
// the reason, while a run (or a scenario evaluation) in progress uses the record; deleting is also
// refused once a run used it, because finished runs must stay readable. Each change is one
// transaction with its audit record.
import { isNotNull, isNull, sql, type SQL } from 'drizzle-orm'
import type { AnyPgColumn } from 'drizzle-orm/pg-core'
import type { H3Event } from 'h3'
import type { ArchivableKind, ArchivedFilter } from '../../shared/schemas/archive'
import { useDb, type Database } from '../db'
import type { Member } from '../utils/auth'
import { recordAudit } from '../utils/audit'
import { conflict, notFound } from '../utils/errors'

type Tx = Pick<Database, 'execute' | 'insert'>

interface Spec {
  table: string
  /** The audit log's entity name (as the create routes write it). */
  entity: string
  label: string
  nameColumn: string
  /** Why the record may not be archived now, or null. */
  archiveBlocker: (tx: Tx, id: string, organisationId: string) => Promise<string | null>
  /** Why the record may not be deleted, or null. */
  deleteBlocker: (tx: Tx, id: string, organisationId: string) => Promise<string | null>
}

async function countOf(tx: Tx, query: SQL): Promise<number> {
  const { rows } = await tx.execute(query)
  return Number((rows[0] as { n?: unknown } | undefined)?.n ?? 0)
}

const plural = (n: number, one: string, many = `${one}s`) => `${n.toLocaleString('en-GB')} ${n === 1 ? one : many}`

const ACTIVE_RUN = sql`r.state IN ('queued', 'running')`
const ACTIVE_EVALUATION = sql`e.state IN ('queued', 'running')`

const SPECS: Record<ArchivableKind, Spec> = {
  assumption_set: {
    table: 'assumption_sets', entity: 'assumption_set', label: 'Assumption set', nameColumn: 'name',
    async archiveBlocker(tx, id) {
      const runs = await countOf(tx, sql`SELECT count(*)::int AS n FROM runs r JOIN assumption_set_versions v ON v.id = r.assumption_version_id WHERE v.assumption_set_id = ${id} AND ${ACTIVE_RUN}`)
      const evaluations = await countOf(tx, sql`SELECT count(*)::int AS n FROM capital_evaluations e JOIN assumption_set_versions v ON v.id = e.assumption_version_id WHERE v.assumption_set_id = ${id} AND ${ACTIVE_EVALUATION}`)
      if (runs + evaluations === 0) return null
      return `${runs ? plural(runs, 'run') : plural(evaluations, 'scenario evaluation')} in progress ${runs + evaluations === 1 ? 'uses' : 'use'} this assumption set. Wait until ${runs + evaluations === 1 ? 'it ends' : 'they end'} (or cancel ${runs + evaluations === 1 ? 'it' : 'them'}), then archive the set.`
    },
    async deleteBlocker(tx, id) {
      const active = await this.archiveBlocker(tx, id, '')
      if (active) return active.replace('then archive the set', 'then delete the set')
      const runs = await countOf(tx, sql`SELECT count(*)::int AS n FROM runs r JOIN assumption_set_versions v ON v.id = r.assumption_version_id WHERE v.assumption_set_id = ${id}`)
      const evaluations = await countOf(tx, sql`SELECT count(*)::int AS n FROM capital_evaluations e JOIN assumption_set_versions v ON v.id = e.assumption_version_id WHERE v.assumption_set_id = ${id}`)
      if (runs + evaluations === 0) return null
      return `${plural(runs, 'run')} and ${plural(evaluations, 'scenario evaluation')} used this assumption set, and their results must stay readable. Archive the set instead: it is then hidden but kept.`
    },
  },
  calibration: {
    table: 'calibrations', entity: 'calibration', label: 'Calibration', nameColumn: 'title',
    async archiveBlocker() { return null },
    async deleteBlocker(tx, id) {
      const runs = await countOf(tx, sql`SELECT count(DISTINCT r.id)::int AS n FROM calibration_applications a JOIN runs r ON r.assumption_version_id = a.assumption_version_id WHERE a.calibration_id = ${id}`)
      if (runs === 0) return null
      return `${plural(runs, 'run')} used an assumption version made from this calibration; it stays as the record of where those values came from. Archive it instead.`
    },
  },
  mitigation_option: {
    table: 'mitigation_options', entity: 'mitigation_option', label: 'Option', nameColumn: 'name',
    async archiveBlocker(tx, id) {
      const evaluations = await countOf(tx, sql`SELECT count(*)::int AS n FROM capital_evaluations e WHERE e.organisation_id = (SELECT organisation_id FROM mitigation_options WHERE id = ${id}) AND ${ACTIVE_EVALUATION}`)
      if (evaluations === 0) return null
      return `${plural(evaluations, 'scenario evaluation')} in progress may use this option's actions. Wait until ${evaluations === 1 ? 'it ends' : 'they end'}, then try again.`
    },
    async deleteBlocker(tx, id, organisationId) {
      const active = await this.archiveBlocker(tx, id, organisationId)
      if (active) return active
      const plans = await countOf(tx, sql`SELECT count(*)::int AS n FROM capital_plans p WHERE p.organisation_id = ${organisationId}
        AND EXISTS (SELECT 1 FROM capital_actions a WHERE a.option_id = ${id} AND p.action_ids ? a.id::text)`)
      if (plans === 0) return null
      return `${plural(plans, 'saved plan')} ${plans === 1 ? 'includes' : 'include'} actions of this option. Delete ${plans === 1 ? 'that plan' : 'those plans'} first, or archive the option instead.`
    },
  },
  policy_terms_set: {
    table: 'policy_terms_sets', entity: 'policy_terms', label: 'Policy terms', nameColumn: 'name',
    async archiveBlocker(tx, id) {
      const runs = await countOf(tx, sql`SELECT count(*)::int AS n FROM run_terms rt JOIN policy_terms_versions v ON v.id = rt.terms_version_id JOIN runs r ON r.id = rt.run_id WHERE v.terms_set_id = ${id} AND ${ACTIVE_RUN}`)
      if (runs === 0) return null
      return `${plural(runs, 'run')} in progress ${runs === 1 ? 'uses' : 'use'} these terms. Wait until ${runs === 1 ? 'it ends' : 'they end'} (or cancel ${runs === 1 ? 'it' : 'them'}), then try again.`
    },
    async deleteBlocker(tx, id) {
      const runs = await countOf(tx, sql`SELECT count(*)::int AS n FROM run_terms rt JOIN policy_terms_versions v ON v.id = rt.terms_version_id WHERE v.terms_set_id = ${id}`)
      if (runs === 0) return null
      return `${plural(runs, 'run')} used these terms, and their insurance figures must stay readable. Archive the terms instead: they are then hidden but kept.`
    },
  },
}

interface Locked { id: string, name: string, archived_at: Date | null }

async function lockRecord(tx: Tx, spec: Spec, id: string, organisationId: string): Promise<Locked> {
  const { rows } = await tx.execute(sql`SELECT id, ${sql.raw(spec.nameColumn)} AS name, archived_at FROM ${sql.raw(spec.table)}
    WHERE id = ${id} AND organisation_id = ${organisationId} FOR UPDATE`)
  const row = rows[0] as Locked | undefined
  if (!row) notFound(spec.label)
  return row
}

/** Archives (archived = true) or restores a record; a no-op when it is already so. */
export async function setArchived(member: Member, event: H3Event, kind: ArchivableKind, id: string, archived: boolean) {
  const spec = SPECS[kind]
  return useDb().transaction(async (tx) => {
    const row = await lockRecord(tx, spec, id, member.organisationId)
    if ((row.archived_at !== null) === archived) return { id, archived, archivedAt: row.archived_at }
    if (archived) {
      const blocker = await spec.archiveBlocker(tx, id, member.organisationId)
      if (blocker) conflict(blocker)
    }
    const { rows } = await tx.execute(sql`UPDATE ${sql.raw(spec.table)}
      SET archived_at = ${archived ? sql`now()` : sql`NULL`}, archived_by = ${archived ? member.user.id : null}, updated_at = now()
      WHERE id = ${id} RETURNING archived_at`)
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: archived ? 'archive' : 'restore', entity: spec.entity, entityId: id, before: { name: row.name, archived: !archived }, after: { archived } }, { tx, event })
    return { id, archived, archivedAt: (rows[0] as { archived_at: Date | null }).archived_at }
  })
}

/** Deletes a record for good, unless a run uses or used it. */
export async function deleteRecord(member: Member, event: H3Event, kind: ArchivableKind, id: string): Promise<void> {
  const spec = SPECS[kind]
  await useDb().transaction(async (tx) => {
    const row = await lockRecord(tx, spec, id, member.organisationId)
    const blocker = await spec.deleteBlocker(tx, id, member.organisationId)
    if (blocker) conflict(blocker)
    await tx.execute(sql`DELETE FROM ${sql.raw(spec.table)} WHERE id = ${id}`)
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'delete', entity: spec.entity, entityId: id, before: { name: row.name, archived: row.archived_at !== null } }, { tx, event })
  })
}

/** The list filter for `?archived=hide|include|only` on an `archived_at` column. */
export function archivedFilter(column: AnyPgColumn, filter: ArchivedFilter): SQL | undefined {
  return filter === 'hide' ? isNull(column) : filter === 'only' ? isNotNull(column) : undefined
}
