// Waiting for a run through the API, as a person watching the runs page would.
import type { Client } from './accounts'

/** Polls GET /api/runs/:id until the run has ended; returns the run. */
export async function waitForRun(client: Client, id: string, timeoutMs = 180_000) {
  const started = Date.now()
  for (;;) {
    const run = await (await client.get(`/api/runs/${id}`)).json()
    if (!['queued', 'running'].includes(run.state)) return run
    if (Date.now() - started > timeoutMs) throw new Error(`run ${id} still ${run.state} after ${timeoutMs} ms`)
    await new Promise(r => setTimeout(r, 300))
  }
}
