// Starts the built app (server + worker + mail fake, through scripts/serve.ts) on a fresh database,
// for the server and browser test projects. Each project has its own database and ports.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process'
import { resolve } from 'node:path'
import { assertNoProcessOutlives, processMarker } from './processes'

export const root = resolve(import.meta.dirname, '../..')
const tsx = resolve(root, 'node_modules/.bin/tsx')

/** Test apps listen on base+1 (server tests) and base+2 (browser tests); mail fakes on base−499/−498. */
export function testPortBase(): number {
  return Number(process.env.STORMLEDGER_TEST_PORT_BASE ?? 3100)
}

export interface AppOptions { dbName: string, port: number, mailPort: number, seedDemo: boolean }

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

export async function startApp(o: AppOptions): Promise<() => Promise<void>> {
  const env = appEnv(o)
  delete env.DATABASE_URL
  runScript('scripts/reset.ts', ['--yes-delete-all-data'], env)
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
  return async () => {
    if (child.exitCode === null) {
      const exited = new Promise(r => child.once('exit', r))
      child.kill('SIGTERM')
      await exited
    }
    await assertNoProcessOutlives(o.dbName)
  }
}
