// npm run bench:import — times an import of 50,000 rows (2,000 sites, 46,000 tanks, 2,000 structures)
// through every step the upload route takes: read the workbook, validate each row, compare with the
// inventory, write in one transaction; then imports the same file again (expects 0 changes).
// Runs against the local database in a throw-away organisation that it deletes afterwards.
import { eq } from 'drizzle-orm'
import seedrandom from 'seedrandom'
import { closeDb, useDb, type Database } from '../server/db/index'
import { organisations } from '../server/db/schema'
import { applyImport, planImport } from '../server/inventory/import'
import { validateFile } from '../server/inventory/rows'
import { readInventoryFile, writeInventoryWorkbook, type SheetRows } from '../server/inventory/workbook'

const SITES = 2000
const TANKS_PER_SITE = 23
const rng = seedrandom('bench import')

function rows(): SheetRows {
  const out: SheetRows = { Sites: [], Tanks: [], Structures: [] }
  for (let s = 0; s < SITES; s++) {
    const site = `B-${s}`
    out.Sites.push({ site_external_id: site, name: `Bench site ${s}`, operator: 'Bench operator', latitude_deg: 31 + rng() * 2, longitude_deg: -104 + rng() * 3, flash_density_per_km2_yr: 2 + rng() * 6, location_notes: '' })
    for (let t = 0; t < TANKS_PER_SITE; t++) {
      const h = 3 + rng() * 7
      out.Tanks.push({
        site_external_id: site, tank_external_id: `${site}-T${t}`, tag: `TK-${t}`, material: 'frp', height_m: h, diameter_m: 3 + rng() * 3,
        x_m: t * 9, y_m: 0, contents: 'crude', flammable_vapour_space: true, grounding: 'single', vapour_control: false, static_dissipator: false, bonding_upgrade: false,
        replacement_value: 80000, contents_value: 30000, cleanup_cost: 50000, interruption_cost: 40000,
        sharp_device_count: 1, sharp_device_height_m: h * 0.8, grounded_pipe_count: 2, grounded_pipe_height_m: h * 0.9,
      })
    }
    out.Structures.push({ site_external_id: site, structure_external_id: `${site}-M`, kind: 'mast', label: 'mast', x_m: -20, y_m: 10, height_m: 20, radius_m: 0.5 })
  }
  return out
}

async function timed<T>(label: string, f: () => Promise<T>): Promise<T> {
  const t0 = performance.now()
  const r = await f()
  console.log(`  ${label.padEnd(34)} ${((performance.now() - t0) / 1000).toFixed(2)} s`)
  return r
}

async function importOnce(db: Database, orgId: string, data: Buffer) {
  const p0 = performance.now()
  const parsed = await timed('read workbook', () => readInventoryFile(data, 'bench.xlsx'))
  const validated = await timed('validate rows', async () => validateFile(parsed))
  const plan = await timed('compare with inventory', () => planImport(db, orgId, validated))
  // What the upload answers with: the preview (a large file's commit then runs as a background job).
  console.log(`  ${'preview (the three steps above)'.padEnd(34)} ${((performance.now() - p0) / 1000).toFixed(2)} s (target ≤ 10 s)`)
  if (plan.errors.length > 0) throw new Error(`unexpected errors: ${JSON.stringify(plan.errors.slice(0, 3))}`)
  await timed('write (one transaction)', () => db.transaction(tx => applyImport(tx as unknown as Database, orgId, plan)))
  return plan.summary
}

const db = useDb()
const [org] = await db.insert(organisations).values({ name: `Bench organisation ${Date.now()}`, kind: 'operator' }).returning()
try {
  const data = await timed('write the 50,000-row workbook', () => writeInventoryWorkbook(rows()))
  console.log(`  file size ${(data.length / 1024 / 1024).toFixed(2)} MB`)
  const t0 = performance.now()
  const first = await importOnce(db, org!.id, data)
  const firstSeconds = (performance.now() - t0) / 1000
  console.log(`first import: ${first.rows} rows, ${first.sites.new} sites, ${first.tanks.new} tanks, ${first.structures.new} structures new in ${firstSeconds.toFixed(2)} s`)
  const t1 = performance.now()
  const again = await importOnce(db, org!.id, data)
  console.log(`same file again: ${again.sites.changed + again.tanks.changed + again.structures.changed} changed, ${again.sites.new + again.tanks.new + again.structures.new} new in ${((performance.now() - t1) / 1000).toFixed(2)} s`)
} finally {
  await db.delete(organisations).where(eq(organisations.id, org!.id))
  await closeDb()
}
