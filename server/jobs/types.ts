// Every background job's name and payload, in one map.
export interface JobPayloads {
  /** organisationId: the organisation that sent it, or null for mail that belongs to the addressee alone. */
  'mail.send': { to: string, subject: string, text: string, organisationId?: string | null }
  /** A password-reset request, worked after the answer so known and unknown addresses answer alike. */
  'auth.password-reset': { email: string, ipAddress: string | null }
  'run.chunk': { runId: string, chunkIndex: number }
  'scenario.site': { evaluationId: string, siteId: string }
  /** A stored storm batch: assign its flashes to windows, recompute those windows, send alerts. */
  'storm.batch': { batchId: string }
  /** A large inventory import's commit (server/inventory/background-import.ts). */
  'inventory.import': { importId: string }
}

export type JobName = keyof JobPayloads
