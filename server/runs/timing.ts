// Where a chunk's time goes, measured by the worker that stored it and kept on its row
// (run_chunks.timing), so bench:runs can print a run's phase breakdown. Pure.

/** Epoch milliseconds with sub-millisecond resolution, comparable between threads of one process. */
export const epochMs = (): number => performance.timeOrigin + performance.now()

export interface ChunkTiming {
  worker: string
  /** When the job was queued (pg-boss) and when this worker's handler picked it up (epoch ms). */
  queuedAt: number | null
  pickedUpAt: number
  endedAt: number
  /** Reading the run, the chunk, the assumptions and the site snapshots. */
  snapshotMs: number
  /** From handing the first site to the threads until the last site came back (wall). */
  computeWallMs: number
  /** Summed over the chunk's sites, measured on the threads. */
  prepareMs: number
  figuresMs: number
  eventBandsMs: number
  /**
   * Summed over sites: handing a task to its thread (once the thread was free, as far as this chunk
   * sees: another chunk's tasks on the same thread count here too, see `siteThreads`) and the result back.
   */
  toThreadMs: number
  fromThreadMs: number
  /** Per site: [thread id, handed over, started on the thread, ended there, back here] (epoch ms). */
  siteThreads?: [number, number, number, number, number][]
  /** The transaction that stores the chunk's results. */
  storeMs: number
  /** The portfolio roll-up, when this chunk was the last one (0 otherwise). */
  finaliseMs: number
  sites: number
  tanks: number
}

export interface SiteThreadTiming {
  threadId: number | string
  /** Epoch ms on the thread when the task started and ended there. */
  startedAt: number
  endedAt: number
}

/**
 * Transfer to and from the threads: a result's way back is the time from its end on the thread to
 * its arrival here; a task's way there is from when its thread was free (or it was handed over, if
 * later) to its start on the thread.
 */
export function threadTransfer(sites: { submittedAt: number, resolvedAt: number, thread: SiteThreadTiming }[]): { toThreadMs: number, fromThreadMs: number } {
  let toThreadMs = 0
  let fromThreadMs = 0
  const byThread = new Map<number | string, typeof sites>()
  for (const s of sites) {
    fromThreadMs += Math.max(0, s.resolvedAt - s.thread.endedAt)
    const list = byThread.get(s.thread.threadId)
    if (list) list.push(s)
    else byThread.set(s.thread.threadId, [s])
  }
  for (const list of byThread.values()) {
    list.sort((a, b) => a.thread.startedAt - b.thread.startedAt)
    let free = -Infinity
    for (const s of list) {
      toThreadMs += Math.max(0, s.thread.startedAt - Math.max(s.submittedAt, free))
      free = s.thread.endedAt
    }
  }
  return { toThreadMs, fromThreadMs }
}

export interface RunPhaseSummary {
  chunks: number
  sites: number
  /** Enqueue → first chunk picked up. */
  firstPickupMs: number
  /** Sums over chunks (ms). */
  snapshotMs: number
  prepareMs: number
  figuresMs: number
  eventBandsMs: number
  toThreadMs: number
  fromThreadMs: number
  storeMs: number
  finaliseMs: number
  /** Transfer to the threads over the whole run (every chunk's sites on the same thread of the same worker). */
  toThreadRunMs: number | null
  /** Handler time summed over chunks (pick-up to end). */
  handlerMs: number
  /** Engine compute on the threads: prepare + figures + event bands. */
  engineMs: number
}

export function summariseChunkTimings(runCreatedAt: number, timings: ChunkTiming[]): RunPhaseSummary {
  const sum = (k: keyof ChunkTiming) => timings.reduce((n, t) => n + (Number(t[k]) || 0), 0)
  const prepareMs = sum('prepareMs')
  const figuresMs = sum('figuresMs')
  const eventBandsMs = sum('eventBandsMs')
  // A thread works the sites of every chunk of its worker: its free time is known only across chunks.
  const all = timings.every(t => t.siteThreads)
    ? timings.flatMap(t => t.siteThreads!.map(([id, submittedAt, startedAt, endedAt, resolvedAt]) => ({
        submittedAt, resolvedAt, thread: { threadId: `${t.worker}#${id}`, startedAt, endedAt },
      })))
    : null
  return {
    toThreadRunMs: all ? threadTransfer(all).toThreadMs : null,
    chunks: timings.length,
    sites: sum('sites'),
    firstPickupMs: timings.length ? Math.min(...timings.map(t => t.pickedUpAt)) - runCreatedAt : 0,
    snapshotMs: sum('snapshotMs'), prepareMs, figuresMs, eventBandsMs,
    toThreadMs: sum('toThreadMs'), fromThreadMs: sum('fromThreadMs'), storeMs: sum('storeMs'), finaliseMs: sum('finaliseMs'),
    handlerMs: timings.reduce((n, t) => n + (t.endedAt - t.pickedUpAt), 0),
    engineMs: prepareMs + figuresMs + eventBandsMs,
  }
}
