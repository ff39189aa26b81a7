// Which handler works which queue (the registry's entries, registry.ts). Handed to the worker
// bootstrap by the worker entry (../worker.ts).
import { failEvaluation } from '../../capital/evaluations'
import { endRunUnsuccessfully, notifyRunEnded } from '../../runs/ending'
import { threadCount } from '../../runs/thread-pool'
import type { JobRegistry } from '../registry'
import { handleMailSend } from './mail-send'
import { handlePasswordReset } from './password-reset'
import { handleRunChunk } from './run-chunk'
import { handleScenarioSite } from './scenario-site'
import { failStormBatch } from '../../storms/process'
import { handleStormBatch } from './storm-batch'
import { failBackgroundImport } from '../../inventory/background-import'
import { handleInventoryImport } from './inventory-import'

export const jobRegistry: JobRegistry = {
  'mail.send': { handler: handleMailSend, work: { pollingIntervalSeconds: 1, batchSize: 5 }, concurrency: () => 1 },
  'auth.password-reset': { handler: handlePasswordReset, work: { pollingIntervalSeconds: 1, batchSize: 5 }, concurrency: () => 1 },
  // One chunk per core at a time; the chunk's sites spread over the thread pool.
  'run.chunk': {
    handler: handleRunChunk, work: { pollingIntervalSeconds: 0.5, batchSize: 1, includeMetadata: true }, concurrency: threadCount, beats: true,
    onAbandoned: async (data, message) => {
      if (await endRunUnsuccessfully(data.runId, 'failed', `Chunk ${data.chunkIndex + 1} ${message}`)) await notifyRunEnded(data.runId)
    },
  },
  // One site per core at a time (capital planning's scenario evaluations).
  'scenario.site': {
    handler: handleScenarioSite, work: { pollingIntervalSeconds: 0.5, batchSize: 1, includeMetadata: true }, concurrency: threadCount, beats: true,
    onAbandoned: (data, message) => failEvaluation(data.evaluationId, `Site ${data.siteId} ${message}`),
  },
  // One storm batch at a time: its windows, results and alerts commit in one transaction.
  'storm.batch': {
    handler: handleStormBatch, work: { pollingIntervalSeconds: 0.5, batchSize: 1, includeMetadata: true }, concurrency: () => 1, beats: true,
    onAbandoned: (data, message) => failStormBatch(data.batchId, message),
  },
  // One large inventory import at a time, all of it in one transaction.
  'inventory.import': {
    handler: handleInventoryImport, work: { pollingIntervalSeconds: 0.5, batchSize: 1, includeMetadata: true }, concurrency: () => 1, beats: true,
    onAbandoned: (data, message) => failBackgroundImport(data.importId, `The import ${message} Nothing was imported; commit it again.`),
  },
}
