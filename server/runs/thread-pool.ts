// A pool of worker threads for site computations: every core of the machine by default.
import { availableParallelism } from 'node:os'
import { Piscina } from 'piscina'
import { settings } from '../settings'
import type { SiteComputation, SiteTask } from './compute'

let pool: Piscina | undefined

export function threadCount(): number {
  return settings.workerThreads ?? availableParallelism()
}

export function useThreadPool(): Piscina {
  pool ??= new Piscina({
    filename: new URL('./compute-task.ts', import.meta.url).href,
    // Every thread starts (and loads the engine) with the worker, not on the first chunk.
    minThreads: threadCount(),
    maxThreads: threadCount(),
    idleTimeout: 60_000,
  })
  return pool
}

export function computeOnThread(task: SiteTask): Promise<SiteComputation> {
  return useThreadPool().run(task) as Promise<SiteComputation>
}

export async function closeThreadPool(): Promise<void> {
  const p = pool
  pool = undefined
  await p?.destroy()
}
