// Server-side session records (user_sessions): one row per sign-in, its id sealed in the cookie and
// checked on every request by memberOfSession. Sign-out revokes the row, so a copied cookie stops
// working at once instead of living on until the seal expires.
import { and, desc, eq, gt, isNull, ne, sql } from 'drizzle-orm'
import { getRequestHeader, type H3Event } from 'h3'
import { useDb, type Database } from '../db'
import { userSessions } from '../db/schema'
import { clientAddress } from '../utils/client-address'

/** A session lasts at most this long from sign-in (as the cookie's seal does). */
export const SESSION_LIFETIME_MS = 7 * 24 * 60 * 60 * 1000
/** last_seen_at is written at most this often per session, so most requests only read. */
const LAST_SEEN_RESOLUTION_MS = 60 * 1000

type Executor = Pick<Database, 'insert' | 'update' | 'select'>

/** Opens a session record for a sign-in and returns its id (to seal into the cookie). */
export async function openSessionRecord(event: H3Event, userId: string, executor: Executor = useDb()): Promise<string> {
  const userAgent = (getRequestHeader(event, 'user-agent') ?? '').slice(0, 200)
  const [row] = await executor.insert(userSessions).values({ userId, userAgent, ipAddress: clientAddress(event).slice(0, 64) }).returning({ id: userSessions.id })
  return row!.id
}

/** The earliest moment a session still in its lifetime may have started. */
export function sessionStartCutoff(now = Date.now()): Date {
  return new Date(now - SESSION_LIFETIME_MS)
}

/** Notes that the session was used, unless that was noted within the last minute. */
export async function touchSession(id: string, lastSeenAt: Date): Promise<void> {
  if (Date.now() - lastSeenAt.getTime() < LAST_SEEN_RESOLUTION_MS) return
  await useDb().update(userSessions).set({ lastSeenAt: new Date() }).where(eq(userSessions.id, id))
}

export async function revokeSession(id: string, executor: Executor = useDb()): Promise<void> {
  await executor.update(userSessions).set({ revokedAt: new Date() }).where(and(eq(userSessions.id, id), isNull(userSessions.revokedAt)))
}

/** Revokes every open session of a person, except `keepId` when given. Returns how many ended. */
export async function revokeUserSessions(userId: string, options: { keepId?: string, executor?: Executor } = {}): Promise<number> {
  const executor = options.executor ?? useDb()
  const rows = await executor.update(userSessions).set({ revokedAt: new Date() })
    .where(and(eq(userSessions.userId, userId), isNull(userSessions.revokedAt), options.keepId ? ne(userSessions.id, options.keepId) : sql`true`))
    .returning({ id: userSessions.id })
  return rows.length
}

/** The person's sessions that still work, newest first (at most 50). */
export async function listOpenSessions(userId: string) {
  return useDb().select({ id: userSessions.id, createdAt: userSessions.createdAt, lastSeenAt: userSessions.lastSeenAt, userAgent: userSessions.userAgent, ipAddress: userSessions.ipAddress })
    .from(userSessions)
    .where(and(eq(userSessions.userId, userId), isNull(userSessions.revokedAt), gt(userSessions.createdAt, sessionStartCutoff())))
    .orderBy(desc(userSessions.lastSeenAt))
    .limit(50)
}
