// Extra worker processes beside the test app's own, for scale-out and crash tests.
import { spawn, type ChildProcess } from 'node:child_process'
import { resolve } from 'node:path'
import { inject } from 'vitest'
import { appEnv, root } from './app-process'

export interface WorkerProcess { child: ChildProcess, output: () => string, ready: Promise<void> }

export function spawnWorker(extraEnv: Record<string, string> = {}): WorkerProcess {
  const child = spawn(resolve(root, 'node_modules/.bin/tsx'), ['server/jobs/worker.ts'], {
    cwd: root,
    // The same settings as the test app's own worker (database, mail fake, chunk expiry), so an extra
    // worker that picks up any job — e-mail included — does what the app's worker would.
    env: { ...appEnv({ dbName: inject('dbName'), port: inject('appPort'), mailPort: inject('mailPort'), seedDemo: false }), ...extraEnv },
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
  return { child, output: () => out, ready }
}

export async function stopWorker(w: WorkerProcess, signal: NodeJS.Signals = 'SIGTERM'): Promise<void> {
  if (w.child.exitCode !== null || w.child.signalCode !== null) return
  const exited = new Promise(r => w.child.once('exit', r))
  // tsx passes SIGTERM on to the worker and waits for it; SIGKILL cannot be passed on, so it goes to
  // the whole group (tsx and the worker), as when a machine dies.
  if (signal === 'SIGKILL') process.kill(-w.child.pid!, 'SIGKILL')
  else w.child.kill(signal)
  await exited
}
