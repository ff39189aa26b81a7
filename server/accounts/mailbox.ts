// What the local SMTP fake caught, in two views that never overlap wrongly:
// - the admin Mailbox: only mail the organisation itself sent (invitations, run notices), whoever
//   it went to; personal mail (password reset, password changed) and mail another organisation sent
//   to the same people never appear there;
// - My mail: every message to the signed-in person's own address, for the demo and tests.
import { desc, eq, sql } from 'drizzle-orm'
import { useDb } from '../db'
import { capturedMail } from '../db/schema'

export interface MailboxMessage { id: string, from: string, to: string, subject: string, body: string, receivedAt: string }

const columns = { id: capturedMail.id, from: capturedMail.fromAddress, to: capturedMail.toAddresses, subject: capturedMail.subject, body: capturedMail.textBody, receivedAt: capturedMail.receivedAt }

function shape(rows: { id: string, from: string, to: string, subject: string, body: string, receivedAt: Date }[]): MailboxMessage[] {
  return rows.map(r => ({ ...r, receivedAt: r.receivedAt.toISOString() }))
}

export async function readMailbox(organisationId: string, limit = 200): Promise<MailboxMessage[]> {
  const rows = await useDb().select(columns).from(capturedMail)
    .where(eq(capturedMail.organisationId, organisationId))
    .orderBy(desc(capturedMail.receivedAt)).limit(limit)
  return shape(rows)
}

/** Messages whose recipients include `email` (the fake stores them joined by ", "). */
export async function readOwnMail(email: string, limit = 100): Promise<MailboxMessage[]> {
  const rows = await useDb().select(columns).from(capturedMail)
    .where(sql`lower(${email}) = ANY (string_to_array(lower(${capturedMail.toAddresses}), ', '))`)
    .orderBy(desc(capturedMail.receivedAt)).limit(limit)
  return shape(rows)
}
