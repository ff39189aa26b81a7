// The suites' process check (tests/support/processes.ts): a process started for a project and left
// running is found through its marker, ended, and fails the check; an ended one is not reported.
import { spawn } from 'node:child_process'
import { describe, expect, it } from 'vitest'
import { assertNoProcessOutlives, markedProcesses, processMarker } from '../support/processes'

function startMarked(dbName: string) {
  return spawn('sleep', ['30'], { env: { ...process.env, ...processMarker(dbName) }, stdio: 'ignore' })
}

describe('processes that outlive the tests', () => {
  it('finds a left-over process by its marker, ends it and fails', async () => {
    const child = startMarked('leak_check_a')
    await new Promise(r => setTimeout(r, 100))
    expect(markedProcesses('leak_check_a').map(p => p.pid)).toEqual([child.pid])
    expect(markedProcesses('leak_check_other')).toEqual([])
    const exited = new Promise(r => child.once('exit', r))
    await expect(assertNoProcessOutlives('leak_check_a', 300)).rejects.toThrow(/1 process\(es\) started by the tests outlived them/)
    await exited
    expect(child.signalCode).toBe('SIGKILL')
  })

  it('passes once the processes have ended within the grace period', async () => {
    const child = startMarked('leak_check_b')
    setTimeout(() => child.kill('SIGTERM'), 200)
    await expect(assertNoProcessOutlives('leak_check_b', 5000)).resolves.toBeUndefined()
  })
})
