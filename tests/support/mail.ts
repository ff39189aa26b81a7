// Reading what the local mail fake caught (captured_mail), for tests that follow e-mailed links.
import type pg from 'pg'

export interface CaughtMail { to: string, subject: string, body: string, receivedAt: Date }

/**
 * Waits for the newest message to `to` received after `since` (the worker delivers within seconds),
 * or, given `subject`, the newest with that subject (a person may be mailed about other things meanwhile).
 */
export async function waitForMail(pool: pg.Pool, to: string, since: Date, timeoutMs = 20_000, subject?: string): Promise<CaughtMail> {
  const started = Date.now()
  while (Date.now() - started < timeoutMs) {
    const { rows } = await pool.query(
      `SELECT to_addresses, subject, text_body, received_at FROM captured_mail WHERE lower(to_addresses) = lower($1) AND received_at >= $2 AND ($3::text IS NULL OR subject = $3) ORDER BY received_at DESC LIMIT 1`,
      [to, since, subject ?? null],
    )
    if (rows[0]) return { to: rows[0].to_addresses, subject: rows[0].subject, body: rows[0].text_body, receivedAt: rows[0].received_at }
    await new Promise(r => setTimeout(r, 250))
  }
  throw new Error(`no message to ${to} within ${timeoutMs} ms`)
}

/** Every message to `to` (oldest first). */
export async function mailTo(pool: pg.Pool, to: string): Promise<CaughtMail[]> {
  const { rows } = await pool.query(`SELECT to_addresses, subject, text_body, received_at FROM captured_mail WHERE lower(to_addresses) = lower($1) ORDER BY received_at`, [to])
  return rows.map(r => ({ to: r.to_addresses, subject: r.subject, body: r.text_body, receivedAt: r.received_at }))
}

/** The first link into the app in a message, as a path (/invitations/…), and its token. */
export function linkIn(body: string, prefix: string): { path: string, token: string } {
  const m = new RegExp(`https?://[^\\s/]+(${prefix.replace(/\//g, '\\/')}([\\w-]+))`).exec(body)
  if (!m) throw new Error(`no ${prefix} link in:\n${body}`)
  return { path: m[1]!, token: m[2]! }
}
