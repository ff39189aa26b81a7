// Job 'mail.send': deliver one message. Retried by pg-boss when SMTP is unreachable.
import type PgBoss from 'pg-boss'
import { sendMail } from '../../mail/transport'
import type { JobPayloads } from '../types'

export async function handleMailSend(jobs: PgBoss.Job<JobPayloads['mail.send']>[]): Promise<void> {
  for (const job of jobs) await sendMail(job.data)
}
