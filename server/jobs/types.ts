// Every background job's name and payload, in one map.
export interface JobPayloads {
  'mail.send': { to: string, subject: string, text: string }
  'run.chunk': { runId: string, chunkIndex: number }
  'scenario.site': { evaluationId: string, siteId: string }
}

export type JobName = keyof JobPayloads
