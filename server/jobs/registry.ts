// The explicit registry: which handler works which queue, with what polling.
import type PgBoss from 'pg-boss'
import { handleMailSend } from './mail-send'
import type { JobName, JobPayloads } from './types'

type Registry = { [K in JobName]: { handler: PgBoss.WorkHandler<JobPayloads[K]>, work: PgBoss.WorkOptions } }

export const jobRegistry: Registry = {
  'mail.send': { handler: handleMailSend, work: { pollingIntervalSeconds: 1, batchSize: 5 } },
}
