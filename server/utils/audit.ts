// The audit trail: who did what to which record, with the state before and after.
import { getRequestIP, type H3Event } from 'h3'
import { useDb, type Database } from '../db'
import { auditEvents } from '../db/schema'

type Executor = Pick<Database, 'insert'>

export interface AuditEntry {
  organisationId: string | null
  userId: string | null
  action: string
  entity: string
  entityId?: string | null
  before?: unknown
  after?: unknown
}

/** Records one change. Pass the transaction so the record commits (or rolls back) with the change. */
/** `ipAddress` stands in for `event` in background jobs that act on a request's behalf. */
/** `via` stands in for `event` in services that record a request's change without it (auditVia). */
export async function recordAudit(entry: AuditEntry, options: { tx?: Executor, event?: H3Event, ipAddress?: string | null, via?: string | null } = {}): Promise<void> {
  const executor = options.tx ?? useDb()
  await executor.insert(auditEvents).values({
    organisationId: entry.organisationId,
    userId: entry.userId,
    action: entry.action,
    entity: entry.entity,
    entityId: entry.entityId ?? null,
    before: entry.before ?? null,
    after: entry.after ?? null,
    ipAddress: options.event ? getRequestIP(options.event, { xForwardedFor: false }) ?? null : options.ipAddress ?? null,
    // A request made with an API token (set by requireMembership) says so; a session's leaves it null.
    via: options.event ? auditVia(options.event) : options.via ?? null,
  })
}

/** 'token <name>' for a request made with an API token (set by requireMembership), null for a session. */
export function auditVia(event: H3Event): string | null {
  return event.context.apiToken ? `token ${event.context.apiToken.name}` : null
}
