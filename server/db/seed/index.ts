// The demo scenario, seeded once per database. Each domain adds its seeder to `seeders`, in order.
import { eq } from 'drizzle-orm'
import { useDb, type Database } from '../index'
import { appState } from '../schema'

export interface Seeder {
  name: string
  run: (db: Database) => Promise<void>
}

/** Seeders in dependency order; each runs inside the one seeding transaction. */
export const seeders: Seeder[] = []

const SEEDED_KEY = 'demo_seeded_at'

export async function isDemoSeeded(db: Database = useDb()): Promise<boolean> {
  const rows = await db.select().from(appState).where(eq(appState.key, SEEDED_KEY))
  return rows.length > 0
}

/** Seeds the demo scenario unless it was seeded before. Returns whether it seeded now. */
export async function seedDemoOnce(db: Database = useDb()): Promise<boolean> {
  return db.transaction(async (tx) => {
    // One seeding at a time, even if two starts race.
    await tx.execute('SELECT pg_advisory_xact_lock(7270001)')
    const done = await tx.select().from(appState).where(eq(appState.key, SEEDED_KEY))
    if (done.length > 0) return false
    for (const seeder of seeders) await seeder.run(tx as unknown as Database)
    await tx.insert(appState).values({ key: SEEDED_KEY, value: { at: new Date().toISOString(), seeders: seeders.map(s => s.name) } })
    return true
  })
}
