// Sends e-mail through nodemailer: to real SMTP when SMTP_HOST is set, otherwise to the local fake.
import nodemailer, { type Transporter } from 'nodemailer'
import { settings } from '../settings'

export interface OutgoingMail {
  to: string
  subject: string
  text: string
  /** The sending organisation, or null/absent for personal mail (see server/utils/mail.ts). */
  organisationId?: string | null
}

/** Tells the local mail fake which organisation sent a message; never sent to real SMTP. */
export const SENDER_HEADER = 'X-Stormledger-Organisation'

let transporter: Transporter | undefined

function useTransporter(): Transporter {
  if (!transporter) {
    const m = settings.mail
    transporter = nodemailer.createTransport({
      host: m.host,
      port: m.port,
      secure: m.secure,
      auth: m.user ? { user: m.user, pass: m.password } : undefined,
      // The local fake speaks plain SMTP on loopback.
      ignoreTLS: m.captured,
    })
  }
  return transporter
}

export async function sendMail(mail: OutgoingMail): Promise<void> {
  const headers = settings.mail.captured && mail.organisationId ? { [SENDER_HEADER]: mail.organisationId } : undefined
  await useTransporter().sendMail({ from: settings.mail.from, to: mail.to, subject: mail.subject, text: mail.text, headers })
}
