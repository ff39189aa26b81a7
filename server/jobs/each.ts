// Batches worked one job at a time. pg-boss fails (and retries) a whole batch when its handler
// throws, so a handler that works a batch in one go would, after one refused job — or a worker that
// dies mid-batch — do the batch's finished jobs again, or hold the others back. Here every job is
// tried, each is marked done the moment it is, and only the refused ones are left to fail and retry.
import type PgBoss from 'pg-boss'
import { useBoss } from './queue'

export async function workEachJob<J extends PgBoss.Job<unknown>>(jobs: J[], work: (job: J) => Promise<void>): Promise<void> {
  const boss = await useBoss()
  const refused: Error[] = []
  for (const job of jobs) {
    try {
      await work(job)
    } catch (error) {
      refused.push(error as Error)
      continue
    }
    // Only jobs still active are ended with the batch, so the batch's failure leaves this one done.
    await boss.complete(job.name, job.id)
  }
  if (refused.length > 0) throw new Error(`${refused.length} of ${jobs.length} jobs failed: ${refused[0]!.message}`)
}
