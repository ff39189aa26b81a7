// The local fake feed: replays a lightning-record CSV (default examples/storm-feed.csv) to
// POST /api/storms/feed on loopback in batches, as a provider would during a storm. Started by
// `npm start` when STORMLEDGER_FAKE_FEED=1, or on its own:
//   npx tsx server/storms/fake-feed.ts [--file path] [--batch 40] [--interval-ms 1000] [--url http://127.0.0.1:3000]
// The token: STORMLEDGER_FAKE_FEED_TOKEN, or a feed it creates for the demo operator (by name,
// STORMLEDGER_FAKE_FEED_ORGANISATION) directly in the database — a local convenience only.
import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { eq } from 'drizzle-orm'
import { closeDb, useDb } from '../db'
import { organisations, stormFeeds } from '../db/schema'
import { newToken } from '../accounts/tokens'

export interface ReplayOptions { url: string, token: string, csv: string, batchSize: number, intervalMs: number, log?: (line: string) => void }

/** Posts the file's records in batches (each with the header line); returns the answers' statuses. */
export async function replayFeed(o: ReplayOptions): Promise<number[]> {
  const [header, ...records] = o.csv.split(/\r?\n/).filter(l => l.trim() !== '')
  const statuses: number[] = []
  for (let i = 0; i < records.length; i += o.batchSize) {
    const body = `${header}\n${records.slice(i, i + o.batchSize).join('\n')}\n`
    const res = await fetch(`${o.url.replace(/\/$/, '')}/api/storms/feed`, { method: 'POST', headers: { 'content-type': 'text/csv', authorization: `Bearer ${o.token}` }, body })
    statuses.push(res.status)
    o.log?.(`[fake feed] batch ${i / o.batchSize + 1}: ${res.status} ${(await res.text()).slice(0, 160)}`)
    if (i + o.batchSize < records.length) await new Promise(r => setTimeout(r, o.intervalMs))
  }
  return statuses
}

/** A new feed for the named organisation, written straight to the database; returns its token. */
export async function createLocalFeed(organisationName: string): Promise<string> {
  const [org] = await useDb().select({ id: organisations.id }).from(organisations).where(eq(organisations.name, organisationName))
  if (!org) throw new Error(`No organisation named "${organisationName}" for the fake feed.`)
  const { token, tokenHash } = newToken()
  await useDb().insert(stormFeeds).values({ organisationId: org.id, name: 'Local fake feed', tokenHash, tokenHint: token.slice(-4) })
  return token
}

function arg(name: string, fallback: string): string {
  const i = process.argv.indexOf(`--${name}`)
  return i >= 0 && process.argv[i + 1] ? process.argv[i + 1]! : fallback
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const root = resolve(import.meta.dirname, '../..')
  const url = arg('url', `http://127.0.0.1:${process.env.PORT ?? 3000}`)
  const host = new URL(url).hostname
  if (host !== '127.0.0.1' && host !== 'localhost') throw new Error('The fake feed posts on loopback only.')
  const token = process.env.STORMLEDGER_FAKE_FEED_TOKEN ?? await createLocalFeed(process.env.STORMLEDGER_FAKE_FEED_ORGANISATION ?? 'Dunmere Basin Operating')
  const csv = readFileSync(resolve(root, arg('file', 'examples/storm-feed.csv')), 'utf8')
  await replayFeed({ url, token, csv, batchSize: Number(arg('batch', '40')), intervalMs: Number(arg('interval-ms', '1000')), log: line => console.log(line) })
  await closeDb()
}
