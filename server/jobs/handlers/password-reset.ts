// Job 'auth.password-reset': the lookup and mailing behind a password-reset request.
import type PgBoss from 'pg-boss'
import { workPasswordResetRequest } from '../../accounts/password-reset-request'
import type { JobPayloads } from '../types'

export async function handlePasswordReset(jobs: PgBoss.Job<JobPayloads['auth.password-reset']>[]): Promise<void> {
  for (const job of jobs) await workPasswordResetRequest(job.data.email, job.data.ipAddress)
}
