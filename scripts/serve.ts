// Runs the production server (or, with --dev, Nuxt's development server with hot reload), one
// background worker, (unless real SMTP is configured) the local mail fake and (unless a bucket is
// configured) the local S3 fake; moves files still kept in PostgreSQL to object storage; stops them all
// cleanly on Ctrl-C. Used by `npm start` and `npm run dev` after set-up.
import { spawn, type ChildProcess } from 'node:child_process'
import { resolve } from 'node:path'
import { settings } from '../server/settings'
import { startMailFake } from '../server/mail/fake-smtp'
import { startS3Fake } from '../server/storage/fake-s3'
import { moveFilesToStorage } from '../server/storage/move'
import { closeDb } from '../server/db/index'
import { sessionSecret } from './session-secret'
import { demoSignIns } from './demo-sign-ins'

const root = resolve(import.meta.dirname, '..')
const port = Number(process.env.PORT ?? 3000)
const env = { ...process.env, NUXT_SESSION_PASSWORD: sessionSecret(root), PORT: String(port), STORMLEDGER_ROOT: root }
const children = new Map<string, ChildProcess>()
let stopping = false
let s3Fake: { stop: () => Promise<void> } | null = null

/** Restarts a process that dies unexpectedly (e.g. a dropped database connection), at most 5 times a minute. */
function run(name: string, command: string, args: string[]): void {
  const restarts: number[] = []
  const launch = () => {
    const child = spawn(command, args, { cwd: root, env, stdio: 'inherit' })
    children.set(name, child)
    child.on('exit', (code, signal) => {
      if (stopping) return
      const now = Date.now()
      restarts.push(now)
      while (restarts.length && now - restarts[0]! > 60_000) restarts.shift()
      if (restarts.length > 5) {
        console.error(`[start] ${name} keeps stopping (${signal ?? `exit ${code}`}); stopping everything`)
        void stop(1)
        return
      }
      console.error(`[start] ${name} stopped unexpectedly (${signal ?? `exit ${code}`}); starting it again`)
      setTimeout(launch, 1000)
    })
  }
  launch()
}

async function stop(code = 0) {
  if (stopping) return
  stopping = true
  console.log('\n[start] stopping the server and the worker…')
  await Promise.all([...children.values()].map(c => new Promise<void>((done) => {
    if (c.exitCode !== null || c.signalCode !== null) return done()
    c.once('exit', () => done())
    c.kill('SIGTERM')
    setTimeout(() => c.kill('SIGKILL'), 15_000).unref()
  })))
  await closeDb().catch(() => {})
  await s3Fake?.stop().catch(() => {})
  console.log('[start] stopped. PostgreSQL keeps running; `npm run db:stop` stops it.')
  process.exit(code)
}

process.on('SIGINT', () => void stop(0))
process.on('SIGTERM', () => void stop(0))

if (settings.mail.captured) {
  await startMailFake(settings.mail.port)
  console.log(`[start] mail fake listening on 127.0.0.1:${settings.mail.port} (messages appear under Admin → Mailbox)`)
}
// STORMLEDGER_S3_FAKE_EXTERNAL=1: the fake runs as its own process (the tests start it, scripts/s3-fake.ts).
if (settings.objects.fake && process.env.STORMLEDGER_S3_FAKE_EXTERNAL !== '1') {
  s3Fake = await startS3Fake(root)
  console.log(`[start] S3 fake listening on 127.0.0.1:${settings.objects.fakePort} (files under ${process.env.STORMLEDGER_S3_FAKE_DIR || '.data/s3'}/)`)
}
// Files stored in PostgreSQL before object storage: moved once the store is up (idempotent).
const { moved } = await moveFilesToStorage()
if (moved > 0) console.log(`[start] moved ${moved} stored file${moved === 1 ? '' : 's'} to object storage`)
run('worker', resolve(root, 'node_modules/.bin/tsx'), ['server/jobs/worker.ts'])
if (process.argv.includes('--dev')) run('server', resolve(root, 'node_modules/.bin/nuxt'), ['dev', '--port', String(port)])
else run('server', process.execPath, ['.output/server/index.mjs'])

const url = `http://localhost:${port}`
for (let i = 0; i < 120; i++) {
  const ok = await fetch(`${url}/api/health`).then(r => r.ok).catch(() => false)
  if (ok) break
  await new Promise(r => setTimeout(r, 500))
}
console.log(`\n  Stormledger is running at ${url}\n`)
const signIns = await demoSignIns()
if (signIns.length > 0) {
  console.log('  Demo sign-ins (password for all: see below):')
  for (const s of signIns) console.log(`    ${s.organisation.padEnd(28)} ${s.role.padEnd(14)} ${s.email}`)
  console.log(`    password: ${signIns[0]!.password}\n`)
}
console.log('  Ctrl-C stops the app and the worker.\n')
// STORMLEDGER_FAKE_FEED=1: replay the example storm to the feed endpoint on loopback (README "After the storm").
if (process.env.STORMLEDGER_FAKE_FEED === '1') {
  const feed = spawn(resolve(root, 'node_modules/.bin/tsx'), ['server/storms/fake-feed.ts', '--url', `http://127.0.0.1:${port}`], { cwd: root, env, stdio: 'inherit' })
  children.set('fake feed', feed)
}
