// Every process the test suites start (the app, its worker and threads, extra workers) carries a
// marker in its environment; a project's teardown proves that none of them outlived it. Children
// inherit the environment, so grandchildren (tsx runs the real Node process as its child) carry it too.
import { readdirSync, readFileSync } from 'node:fs'

const MARKER_VARIABLE = 'STORMLEDGER_TEST_PROCESS'

/** One token per `npm test`, shared with Vitest's workers through the environment. */
function runToken(): string {
  process.env.STORMLEDGER_TEST_RUN ??= `${process.pid}-${Date.now()}`
  return process.env.STORMLEDGER_TEST_RUN
}

/** The environment entry that marks processes started for the project using database `dbName`. */
export function processMarker(dbName: string): Record<string, string> {
  return { [MARKER_VARIABLE]: `${runToken()}:${dbName}` }
}

interface MarkedProcess { pid: number, command: string }

/** Processes alive now whose environment carries the marker (Linux /proc). */
export function markedProcesses(dbName: string): MarkedProcess[] {
  const entry = `${MARKER_VARIABLE}=${runToken()}:${dbName}`
  const found: MarkedProcess[] = []
  for (const name of readdirSync('/proc')) {
    if (!/^\d+$/.test(name) || Number(name) === process.pid) continue
    try {
      const environ = readFileSync(`/proc/${name}/environ`, 'latin1').split('\0')
      if (!environ.includes(entry)) continue
      const state = readFileSync(`/proc/${name}/stat`, 'latin1').split(') ')[1]?.[0]
      if (state === 'Z') continue // exited, waiting for its parent to read the status
      found.push({ pid: Number(name), command: readFileSync(`/proc/${name}/cmdline`, 'latin1').replaceAll('\0', ' ').trim() })
    } catch {
      // The process ended while we looked, or is not ours to read.
    }
  }
  return found
}

/**
 * After a project's own clean-up: waits a few seconds for its processes to end, then ends any that
 * remain and fails the run, naming them.
 */
export async function assertNoProcessOutlives(dbName: string, graceMs = 10_000): Promise<void> {
  const until = Date.now() + graceMs
  let left = markedProcesses(dbName)
  while (left.length && Date.now() < until) {
    await new Promise(r => setTimeout(r, 200))
    left = markedProcesses(dbName)
  }
  if (!left.length) return
  for (const p of left) {
    try { process.kill(p.pid, 'SIGKILL') } catch { /* already gone */ }
  }
  throw new Error(`${left.length} process(es) started by the tests outlived them (now ended):\n${left.map(p => `  ${p.pid} ${p.command}`).join('\n')}`)
}
