// Starts the built app (server + worker + mail fake, through scripts/serve.ts) on a fresh database,
// for the server and browser test projects. Each project has its own database and ports.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process'
import { resolve } from 'node:path'
import { assertNoProcessOutlives, processMarker } from './processes'

export const root = resolve(import.meta.dirname, '../..')
const tsx = resolve(root, 'node_modules/.bin/tsx')

/** Test apps listen on base+1 (server tests) and base+2 (browser tests); mail fakes on base−499/−498; S3 fakes on base−497/−496. */
export function testPortBase(): number {
  return Number(process.env.STORMLEDGER_TEST_PORT_BASE ?? 3100)
}

export interface AppOptions { dbName: string, port: number, mailPort: number, s3Port: number, seedDemo: boolean }

export function appEnv(o: AppOptions): NodeJS.ProcessEnv {
  return {
    ...process.env,
    ...processMarker(o.dbName),
    STORMLEDGER_DB_NAME: o.dbName,
    DATABASE_URL: '',
    PORT: String(o.port),
    STORMLEDGER_MAIL_FAKE_PORT: String(o.mailPort),
    STORMLEDGER_PUBLIC_URL: `http://localhost:${o.port}`,
    SMTP_HOST: '',
    // Files go to this project's own S3 fake (started by scripts/serve.ts), under .data/s3-<database>/.
    STORMLEDGER_S3_BUCKET: '',
    STORMLEDGER_S3_FAKE_PORT: String(o.s3Port),
    STORMLEDGER_S3_FAKE_DIR: `.data/s3-${o.dbName}`,
    STORMLEDGER_S3_FAKE_EXTERNAL: '1',
    STORMLEDGER_S3_TIMEOUT_MS: '3000',
    // The production expiry (600 s): a dead worker's chunks must be handed on by their heartbeats,
    // not by expiry. Frequent maintenance so retries are picked up quickly.
    STORMLEDGER_QUEUE_MAINTENANCE_SECONDS: '2',
    NODE_ENV: 'production',
  }
}

function runScript(script: string, args: string[], env: NodeJS.ProcessEnv) {
  const r = spawnSync(tsx, [script, ...args], { cwd: root, env, encoding: 'utf8' })
  if (r.status !== 0) throw new Error(`${script} failed:\n${r.stdout}\n${r.stderr}`)
}

/** The S3 fake as its own process (a test can pause it to make the store unreachable); answers its pid. */
async function startS3FakeProcess(env: NodeJS.ProcessEnv): Promise<{ child: ChildProcess, pid: number }> {
  const child = spawn(tsx, ['scripts/s3-fake.ts'], { cwd: root, env, stdio: ['ignore', 'pipe', 'pipe'] })
  let output = ''
  child.stdout?.on('data', (d: Buffer) => { output += d.toString() })
  child.stderr?.on('data', (d: Buffer) => { output += d.toString() })
  const started = Date.now()
  for (;;) {
    const m = /\[s3 fake\] ready .*\(pid (\d+)\)/.exec(output)
    if (m) return { child, pid: Number(m[1]) }
    if (child.exitCode !== null) throw new Error(`the S3 fake exited during start:\n${output}`)
    if (Date.now() - started > 30_000) throw new Error(`the S3 fake did not start within 30 s:\n${output}`)
    await new Promise(r => setTimeout(r, 100))
  }
}

async function stopChild(child: ChildProcess) {
  if (child.exitCode !== null || child.signalCode !== null) return
  const exited = new Promise(r => child.once('exit', r))
  child.kill('SIGTERM')
  await exited
}

export async function startApp(o: AppOptions): Promise<{ stop: () => Promise<void>, s3FakePid: number }> {
  const env = appEnv(o)
  delete env.DATABASE_URL
  runScript('scripts/reset.ts', ['--yes-delete-all-data'], env)
  const s3 = await startS3FakeProcess(env)
  if (o.seedDemo) runScript('scripts/seed.ts', [], env)
  const child: ChildProcess = spawn(tsx, ['scripts/serve.ts'], { cwd: root, env, stdio: ['ignore', 'pipe', 'pipe'] })
  let output = ''
  child.stdout?.on('data', (d: Buffer) => { output += d.toString() })
  child.stderr?.on('data', (d: Buffer) => { output += d.toString() })
  const base = `http://localhost:${o.port}`
  const started = Date.now()
  while (!output.includes('Stormledger is running at')) {
    if (child.exitCode !== null) throw new Error(`the app exited during start:\n${output}`)
    if (Date.now() - started > 90_000) throw new Error(`the app did not start within 90 s:\n${output}`)
    await new Promise(r => setTimeout(r, 200))
  }
  process.env.STORMLEDGER_TEST_BASE_URL = base
  const stop = async () => {
    await stopChild(child)
    // A paused fake (a test that made the store unreachable) is woken so it can stop.
    try { process.kill(s3.pid, 'SIGCONT') } catch { /* gone already */ }
    await stopChild(s3.child)
    await assertNoProcessOutlives(o.dbName)
  }
  return { stop, s3FakePid: s3.pid }
}
