// Sign-in throttling, stored in PostgreSQL so every server process counts the same attempts:
// after MAX_FAILURES failed attempts for one e-mail address, or from one client address, within
// WINDOW, further attempts are refused with 429 and Retry-After until the oldest counted failure
// leaves the window. A successful sign-in clears the count for its e-mail address (not for the
// client address). Unknown addresses are counted like known ones, so throttling reveals nothing.
import { sql } from 'drizzle-orm'
import { createError, setResponseHeader, type H3Event } from 'h3'
import { useDb } from '../db'
import { signInAttempts } from '../db/schema'

export const SIGN_IN_MAX_FAILURES = 10
export const SIGN_IN_WINDOW_MS = 15 * 60 * 1000

interface Counted { count: number, oldest: Date | null }

async function countFailures(column: 'email' | 'ip_address', value: string, since: Date): Promise<Counted> {
  const db = useDb()
  const resetBySuccess = column === 'email'
    ? sql`AND at > coalesce((SELECT max(at) FROM sign_in_attempts WHERE email = ${value} AND succeeded), '-infinity')`
    : sql``
  const result = await db.execute<{ count: number, oldest: string | null }>(sql`
    SELECT count(*)::int AS count, min(at) AS oldest FROM (
      SELECT at FROM sign_in_attempts
      WHERE ${sql.identifier(column)} = ${value} AND NOT succeeded AND at > ${since.toISOString()} ${resetBySuccess}
      ORDER BY at DESC LIMIT ${SIGN_IN_MAX_FAILURES}
    ) recent`)
  const row = result.rows[0]
  return { count: Number(row?.count ?? 0), oldest: row?.oldest ? new Date(row.oldest) : null }
}

/** Throws 429 with Retry-After when the e-mail address or the client address is throttled. */
export async function assertSignInAllowed(event: H3Event, email: string, address: string): Promise<void> {
  const now = Date.now()
  const since = new Date(now - SIGN_IN_WINDOW_MS)
  const counts = await Promise.all([countFailures('email', email, since), countFailures('ip_address', address, since)])
  const blocking = counts.filter(c => c.count >= SIGN_IN_MAX_FAILURES && c.oldest)
  if (blocking.length === 0) return
  const freeAt = Math.max(...blocking.map(c => c.oldest!.getTime() + SIGN_IN_WINDOW_MS))
  const seconds = Math.max(1, Math.ceil((freeAt - now) / 1000))
  setResponseHeader(event, 'Retry-After', seconds)
  const minutes = Math.ceil(seconds / 60)
  throw createError({
    statusCode: 429,
    statusMessage: `Too many sign-in attempts. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}, or reset your password.`,
    data: { retryAfterSeconds: seconds },
  })
}

export async function recordSignInAttempt(email: string, address: string, succeeded: boolean): Promise<void> {
  const db = useDb()
  await db.insert(signInAttempts).values({ email, ipAddress: address, succeeded })
  // Keep the table small: nothing older than a day is ever counted.
  if (Math.random() < 0.05) await db.execute(sql`DELETE FROM sign_in_attempts WHERE at < now() - interval '1 day'`)
}
