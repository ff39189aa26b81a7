import { promisify } from 'node:util'
import { gzip } from 'node:zlib'
import { getRequestHeader, setResponseHeader, type H3Event } from 'h3'
import { useDb } from '../db'
import { documentVersion, storedDocument, type DocumentKey } from './documents'

const gzipAsync = promisify(gzip)

// Results of a succeeded run never change, so the payloads the result views read are kept in memory
// (a few recent runs per server process) instead of being rebuilt for every viewer.
const MAX_ENTRIES = 24
const entries = new Map<string, Promise<unknown>>()

export function cachedResult<T>(key: string, build: () => Promise<T>): Promise<T> {
  const hit = entries.get(key)
  if (hit) {
    // Refresh its place: the map's order is the eviction order.
    entries.delete(key)
    entries.set(key, hit)
    return hit as Promise<T>
  }
  const pending = build().catch((error) => {
    entries.delete(key)
    throw error
  })
  entries.set(key, pending)
  while (entries.size > MAX_ENTRIES) entries.delete(entries.keys().next().value!)
  return pending
}

/**
 * The same, kept as the serialised JSON body: under many concurrent viewers of a large run (the
 * site list of thousands of sites) serialising the payload again for every request is most of a
 * request's time. The route sets `content-type: application/json` and returns this as it is. The
 * promise is typed as the payload it serialises, which is what the client receives and parses, so
 * the route's typed `$fetch` / `useFetch` results stay those of the payload.
 */
export function cachedJson<T>(key: string, build: () => Promise<T>): Promise<T> {
  return cachedResult(`json:${key}`, async () => JSON.stringify(await build())) as Promise<unknown> as Promise<T>
}

/** A stored result document as a process keeps it: the JSON and, for a large one, its gzip encoding. */
export interface CachedDocument { json: string, gzip: Buffer | null }

/** Documents below this size are sent as they are: compressing them saves less than it costs. */
const GZIP_FROM_BYTES = 16 * 1024

/**
 * A result view's stored document (server/results/documents.ts) through this process's memory:
 * read (or built once, under the database lock) on the first request of this process, then served
 * from memory with its gzip encoding made once. Null: the view has nothing to show (not kept).
 */
export async function cachedDocument(key: DocumentKey, build: () => Promise<unknown>): Promise<CachedDocument | null> {
  const name = `document:${key.runId}:${key.view}:${key.currency}:${documentVersion(key)}`
  const doc = await cachedResult(name, async () => {
    const json = await storedDocument(useDb(), key, build)
    if (json === null) return null
    return { json, gzip: Buffer.byteLength(json) >= GZIP_FROM_BYTES ? await gzipAsync(json, { level: 6 }) : null }
  })
  if (doc === null) entries.delete(name)
  return doc
}

/**
 * Sends a cached document: gzip-encoded when the client accepts it and the document is large, the
 * JSON as it is otherwise. Typed as the payload `T` it serialises (see cachedJson).
 */
export function sendDocument<T>(event: H3Event, doc: CachedDocument): T {
  setResponseHeader(event, 'content-type', 'application/json; charset=utf-8')
  setResponseHeader(event, 'vary', 'accept-encoding')
  if (doc.gzip && /\bgzip\b/i.test(getRequestHeader(event, 'accept-encoding') ?? '')) {
    setResponseHeader(event, 'content-encoding', 'gzip')
    return doc.gzip as unknown as T
  }
  return doc.json as unknown as T
}
