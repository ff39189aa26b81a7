// Extra worker processes beside the test app's own, for scale-out and crash tests.
import { spawn, type ChildProcess } from 'node:child_process'
import { resolve } from 'node:path'
import { inject } from 'vitest'
import { appEnv, root } from './app-process'

/**
 * `child` is tsx's launcher; the worker itself is the launcher's child, whose pid (`workerPid`, known
 * once ready) is what its chunks record and what a crash test must kill.
 */
export interface WorkerProcess { child: ChildProcess, output: () => string, ready: Promise<void>, workerPid: () => number | undefined }

export function spawnWorker(extraEnv: Record<string, string> = {}): WorkerProcess {
  const child = spawn(resolve(root, 'node_modules/.bin/tsx'), ['server/jobs/worker.ts'], {
    cwd: root,
    // The same settings as the test app's own worker (database, mail fake, chunk expiry), so an extra
    // worker that picks up any job — e-mail included — does what the app's worker would.
    env: { ...appEnv({ dbName: inject('dbName'), port: inject('appPort'), mailPort: inject('mailPort'), s3Port: inject('s3Port'), seedDemo: false }), ...extraEnv },
    stdio: ['ignore', 'pipe', 'pipe'],
    // Its own process group, so that a hard kill reaches the Node process that tsx starts as its child.
    detached: true,
  })
  let out = ''
  child.stdout?.on('data', (d: Buffer) => { out += d.toString() })
  child.stderr?.on('data', (d: Buffer) => { out += d.toString() })
  const ready = new Promise<void>((res, rej) => {
    const timer = setInterval(() => {
      if (out.includes('[worker] ready')) { clearInterval(timer); res() }
      if (child.exitCode !== null) { clearInterval(timer); rej(new Error(`worker exited: ${out}`)) }
    }, 100)
  })
  const workerPid = () => {
    const m = /\[worker\] ready \(pid (\d+)\)/.exec(out)
    return m ? Number(m[1]) : undefined
  }
  return { child, output: () => out, ready, workerPid }
}

export async function stopWorker(w: WorkerProcess, signal: NodeJS.Signals = 'SIGTERM'): Promise<void> {
  if (w.child.exitCode !== null || w.child.signalCode !== null) return
  const exited = new Promise(r => w.child.once('exit', r))
  // SIGKILL cannot be relayed by the launcher: kill the worker itself (the launcher then exits).
  const pid = w.workerPid()
  if (signal === 'SIGKILL' && pid) process.kill(pid, 'SIGKILL')
  else w.child.kill(signal)
  await exited
}
