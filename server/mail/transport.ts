// Sends e-mail through nodemailer: to real SMTP when SMTP_HOST is set, otherwise to the local fake.
import nodemailer, { type Transporter } from 'nodemailer'
import { settings } from '../settings'

export interface OutgoingMail {
  to: string
  subject: string
  text: string
}

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
  await useTransporter().sendMail({ from: settings.mail.from, to: mail.to, subject: mail.subject, text: mail.text })
}
