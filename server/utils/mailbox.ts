// The admin Mailbox: what the local SMTP fake caught for the organisation's people.
import { sql } from 'drizzle-orm'
import { useDb } from '../db'

export interface MailboxMessage { id: string, from: string, to: string, subject: string, body: string, receivedAt: string }

export async function readMailbox(organisationId: string, limit = 200): Promise<MailboxMessage[]> {
  const result = await useDb().execute<{ id: string, from_address: string, to_addresses: string, subject: string, text_body: string, received_at: string | Date }>(sql`
    SELECT c.id, c.from_address, c.to_addresses, c.subject, c.text_body, c.received_at
    FROM captured_mail c
    WHERE EXISTS (
      SELECT 1 FROM unnest(string_to_array(lower(c.to_addresses), ', ')) AS rcpt(address)
      WHERE rcpt.address IN (
        SELECT u.email FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.organisation_id = ${organisationId}
        UNION
        SELECT i.email FROM invitations i WHERE i.organisation_id = ${organisationId}
      )
    )
    ORDER BY c.received_at DESC
    LIMIT ${limit}`)
  return result.rows.map(r => ({ id: r.id, from: r.from_address, to: r.to_addresses, subject: r.subject, body: r.text_body, receivedAt: new Date(r.received_at).toISOString() }))
}
