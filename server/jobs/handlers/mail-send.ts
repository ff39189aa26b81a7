// Job 'mail.send': deliver messages, a batch at a time, each once (server/jobs/each.ts).
// Retried by pg-boss when SMTP is unreachable.
import type PgBoss from 'pg-boss'
import { sendMail } from '../../mail/transport'
import { workEachJob } from '../each'
import type { JobPayloads } from '../types'

export function handleMailSend(jobs: PgBoss.Job<JobPayloads['mail.send']>[]): Promise<void> {
  return workEachJob(jobs, job => sendMail(job.data))
}
