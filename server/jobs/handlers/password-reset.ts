// Job 'auth.password-reset': the lookup and mailing behind a password-reset request, each request
// once (server/jobs/each.ts).
import type PgBoss from 'pg-boss'
import { workPasswordResetRequest } from '../../accounts/password-reset-request'
import { workEachJob } from '../each'
import type { JobPayloads } from '../types'

export function handlePasswordReset(jobs: PgBoss.Job<JobPayloads['auth.password-reset']>[]): Promise<void> {
  return workEachJob(jobs, async (job) => { await workPasswordResetRequest(job.data.email, job.data.ipAddress) })
}
