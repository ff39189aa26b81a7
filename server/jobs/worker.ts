// The background worker: `npm run worker` (npm start runs one beside the server).
// Any number may run, here or on other machines pointed at the same DATABASE_URL.
// The one place that joins the queue plumbing (bootstrap.ts) to the handlers (handlers/index.ts).
import { closeThreadPool } from '../runs/thread-pool'
import { runWorker } from './bootstrap'
import { jobRegistry } from './handlers'

runWorker(jobRegistry, { onStop: closeThreadPool })
