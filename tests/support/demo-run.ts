// The demo scenario's run, as the browser tests wait for it.
import type { Page } from 'playwright-core'

// The demo scenario's insurer underwriter (README "Demo sign-ins").
export const DEMO_UNDERWRITER = 'underwriter@cobaltridge.example'
export const DEMO_PASSWORD = 'stormledger-demo-2026'

/** The demo run queued at seeding: waits (from the page, with its session) until it has finished. */
export async function demoRun(p: Page): Promise<string> {
  for (let i = 0; i < 400; i++) {
    const runs = await p.evaluate(async () => (await fetch('/api/runs')).json()) as { id: string, state: string, requestedBy: string | null }[]
    // The demo's own run (queued by the seeder: nobody requested it), not a run another browser test
    // started in the same organisation.
    const done = runs.find(r => r.state === 'succeeded' && r.requestedBy === null)
    if (done) return done.id
    if (runs.length && runs.every(r => r.state === 'failed' || r.state === 'cancelled')) throw new Error('the demo run did not succeed')
    await p.waitForTimeout(1000)
  }
  throw new Error('the demo run did not finish in time')
}
