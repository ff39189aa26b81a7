// Uploads are read on threads of their own, never on the web server's event loop: a pathological
// file costs one thread its time and memory, while the server keeps answering. Each thread has a
// bounded heap (a file that needs more is refused with 413), a few threads at most, a short queue
// (beyond it, 503 "try again") and a time limit per file.
import { existsSync } from 'node:fs'
import { resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { Piscina } from 'piscina'
import { settings } from '../settings'
import type { ParseOutcome, ParseTask } from './parse-upload'
import { AppError } from '../utils/errors'

export const UPLOAD_THREAD_LIMITS = {
  /** V8 old-generation heap per upload thread, MB. */
  heapMb: 512,
  /** Time one file may take to read, ms. */
  timeoutMs: 60_000,
  /** Files waiting for a thread before new ones are turned away. */
  maxQueue: 8,
}

/** The thread entry, found beside this file (tsx, tests) or in the source tree (the Nitro bundle). */
function threadFile(): string {
  const beside = fileURLToPath(new URL('./parse-thread.mjs', import.meta.url))
  if (existsSync(beside)) return beside
  return resolve(process.cwd(), 'server/inventory/parse-thread.mjs')
}

let pool: Piscina | undefined

function usePool(): Piscina {
  pool ??= new Piscina({
    filename: threadFile(),
    // One thread starts with the server (it loads the reader once), more as uploads arrive.
    minThreads: 1,
    maxThreads: settings.uploadThreads,
    maxQueue: UPLOAD_THREAD_LIMITS.maxQueue,
    idleTimeout: 30_000,
    resourceLimits: { maxOldGenerationSizeMb: UPLOAD_THREAD_LIMITS.heapMb, maxYoungGenerationSizeMb: 64 },
  })
  return pool
}

export async function parseOnThread(task: ParseTask): Promise<ParseOutcome> {
  try {
    return await usePool().run(task, { signal: AbortSignal.timeout(UPLOAD_THREAD_LIMITS.timeoutMs) }) as ParseOutcome
  } catch (error) {
    const e = error as { code?: string, name?: string, message?: string }
    if (e.code === 'ERR_WORKER_OUT_OF_MEMORY') {
      throw new AppError(413, `The file needs more than ${UPLOAD_THREAD_LIMITS.heapMb} MB of memory to read, the limit for one upload. Split it into several files.`)
    }
    if (e.name === 'AbortError' || e.name === 'TimeoutError') {
      throw new AppError(413, `The file took longer than ${UPLOAD_THREAD_LIMITS.timeoutMs / 1000} s to read, the limit for one upload. Split it into several files.`)
    }
    if (/queue is at limit/i.test(e.message ?? '')) {
      throw new AppError(503, 'Several uploads are being read already. Try again in a minute.')
    }
    throw error
  }
}

export async function closeParsePool(): Promise<void> {
  const p = pool
  pool = undefined
  await p?.destroy()
}

/** Starts the first upload thread now, so the first upload does not wait for it to load. */
export function warmParsePool(): void {
  usePool()
}
