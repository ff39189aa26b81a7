// The local SMTP fake: accepts every message on 127.0.0.1 and stores it in PostgreSQL (captured_mail),
// where the admin Mailbox page and the tests read it. Never used when real SMTP is configured.
import { simpleParser } from 'mailparser'
import { SMTPServer } from 'smtp-server'
import { useDb } from '../db/index'
import { capturedMail } from '../db/schema'
import { SENDER_HEADER } from './transport'

export async function startMailFake(port: number): Promise<SMTPServer> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    size: 5 * 1024 * 1024,
    onData(stream, session, callback) {
      const chunks: Buffer[] = []
      stream.on('data', (c: Buffer) => chunks.push(c))
      stream.on('end', () => {
        const raw = Buffer.concat(chunks)
        storeMessage(raw, session.envelope.rcptTo.map(r => r.address), session.envelope.mailFrom ? session.envelope.mailFrom.address : '')
          .then(() => callback())
          .catch((error: Error) => callback(error))
      })
    },
  })
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(port, '127.0.0.1', () => resolve())
  })
  server.on('error', err => console.error('[mail] SMTP fake error:', err.message))
  return server
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i

/** The sending organisation from the app's header; anything else counts as personal mail. */
function senderOrganisation(value: unknown): string | null {
  return typeof value === 'string' && UUID.test(value.trim()) ? value.trim().toLowerCase() : null
}

async function storeMessage(raw: Buffer, to: string[], from: string): Promise<void> {
  const parsed = await simpleParser(raw)
  const organisationId = senderOrganisation(parsed.headers.get(SENDER_HEADER.toLowerCase()))
  const insert = () => useDb().insert(capturedMail).values({
    organisationId,
    fromAddress: from,
    toAddresses: to.join(', '),
    subject: parsed.subject ?? '(no subject)',
    textBody: parsed.text ?? '',
    raw: raw.toString('utf8'),
  })
  // A pooled connection that PostgreSQL dropped fails once; a fresh one takes the message.
  await insert().catch(() => insert())
}
