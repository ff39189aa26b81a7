// Reading the audit log for an organisation's admins: the organisation's own events, plus account
// events (failed sign-ins, password resets) of people who are its members.
import { and, count, desc, eq, gte, inArray, isNull, lt, or, type SQL } from 'drizzle-orm'
import { useDb } from '../db'
import { auditEvents, memberships, users } from '../db/schema'
import type { AuditQuery } from '../../shared/schemas/auth'
import { pageWindow } from '../db/pagination'

export const AUDIT_PAGE_SIZE = 50

function scope(organisationId: string): SQL {
  const members = useDb().select({ id: memberships.userId }).from(memberships).where(eq(memberships.organisationId, organisationId))
  return or(eq(auditEvents.organisationId, organisationId), and(isNull(auditEvents.organisationId), inArray(auditEvents.userId, members)))!
}

/** The filters of the log's screen (person, entity, UTC days inclusive), within the organisation's scope. */
function auditWhere(organisationId: string, q: Omit<AuditQuery, 'page'>): SQL {
  const filters: SQL[] = [scope(organisationId)]
  if (q.person) filters.push(eq(auditEvents.userId, q.person))
  if (q.entity) filters.push(eq(auditEvents.entity, q.entity))
  if (q.from) filters.push(gte(auditEvents.at, new Date(`${q.from}T00:00:00Z`)))
  if (q.to) filters.push(lt(auditEvents.at, new Date(new Date(`${q.to}T00:00:00Z`).getTime() + 86_400_000)))
  return and(...filters)!
}

function eventsQuery(where: SQL) {
  return useDb().select({
    id: auditEvents.id, at: auditEvents.at, action: auditEvents.action, entity: auditEvents.entity, entityId: auditEvents.entityId,
    before: auditEvents.before, after: auditEvents.after, ipAddress: auditEvents.ipAddress, via: auditEvents.via,
    personId: users.id, personName: users.name, personEmail: users.email,
  }).from(auditEvents).leftJoin(users, eq(users.id, auditEvents.userId))
    .where(where).orderBy(desc(auditEvents.at), desc(auditEvents.id))
}

/** Most events one export holds (newest first); the export says when the filters match more. */
export const AUDIT_EXPORT_LIMIT = 100_000

/** Every event the filters match, newest first, up to AUDIT_EXPORT_LIMIT, and how many match in all. */
export async function auditEventsForExport(organisationId: string, q: Omit<AuditQuery, 'page'>) {
  const where = auditWhere(organisationId, q)
  const [events, [total]] = await Promise.all([eventsQuery(where).limit(AUDIT_EXPORT_LIMIT), useDb().select({ n: count() }).from(auditEvents).where(where)])
  return { events, total: total?.n ?? 0 }
}

export async function readAuditLog(organisationId: string, q: AuditQuery) {
  const db = useDb()
  const where = auditWhere(organisationId, q)
  const window = pageWindow({ page: q.page, pageSize: AUDIT_PAGE_SIZE })
  const [events, [total], people, entities] = await Promise.all([
    eventsQuery(where).limit(window.limit).offset(window.offset),
    db.select({ n: count() }).from(auditEvents).where(where),
    db.selectDistinct({ id: users.id, name: users.name, email: users.email }).from(auditEvents)
      .innerJoin(users, eq(users.id, auditEvents.userId)).where(scope(organisationId)).orderBy(users.name),
    db.selectDistinct({ entity: auditEvents.entity }).from(auditEvents).where(scope(organisationId)).orderBy(auditEvents.entity),
  ])
  return {
    events: events.map(({ personId, personName, personEmail, ...e }) => ({ ...e, person: personId ? { id: personId, name: personName!, email: personEmail! } : null })),
    total: total?.n ?? 0,
    page: q.page,
    pageSize: AUDIT_PAGE_SIZE,
    people,
    entities: entities.map(e => e.entity),
  }
}

