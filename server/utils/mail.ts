// Mail from request handlers goes through the queue ('mail.send'): a slow or unreachable SMTP server
// never fails or delays the request, and the worker retries delivery.
import { enqueue } from '../jobs/queue'
import type { MailContent } from '../mail/templates'
import { settings } from '../settings'

/**
 * Who a message is from: an organisation (invitations, run notices — its admins see it in the
 * Mailbox) or 'personal' (password reset, password changed — only the addressee ever sees it).
 */
export type MailSender = { organisationId: string } | 'personal'

export async function queueMail(to: string, content: MailContent, sender: MailSender): Promise<void> {
  await enqueue('mail.send', { to, subject: content.subject, text: content.text, organisationId: sender === 'personal' ? null : sender.organisationId })
}

/** An absolute link into the app, for e-mails (STORMLEDGER_PUBLIC_URL). */
export function appLink(path: string): string {
  return `${settings.publicUrl}${path}`
}
