// A succeeded simulated-years run with hand-made loss events, written straight into the result
// tables, so that the financial view can be checked against figures worked out by hand.
import type pg from 'pg'
import { encodeEvents } from '../../server/runs/events-codec'

/**
 * Packs events (year, loss[, property-damage part]), one tank per event, as the year mode stores
 * them. Without the third element the whole loss is property damage.
 */
export function packEvents(events: ([number, number] | [number, number, number])[]): Buffer {
  const pd = Float64Array.from(events.map(e => e[2] ?? e[1]))
  return encodeEvents({
    year: Int32Array.from(events.map(e => e[0])), loss: Float64Array.from(events.map(e => e[1])),
    tankStart: Int32Array.from({ length: events.length + 1 }, (_, i) => i), tankIndex: new Int32Array(events.length), tankLoss: Float64Array.from(events.map(e => e[1])),
    split: { propertyDamage: pd, tankPropertyDamage: pd, tankBySpread: new Uint8Array(events.length) },
  })
}

/** The layout engine 1 stored (no PD / BI split), for checking that old runs stay readable. */
export function packEventsEngine1(events: [number, number][]): Buffer {
  const n = events.length
  const pad = (b: number) => (b + 7) & ~7
  const buf = Buffer.alloc(8 + pad(4 * n) + 8 * n + pad(4 * (n + 1)) + pad(4 * n) + 8 * n)
  buf.writeUInt32LE(n, 0)
  buf.writeUInt32LE(n, 4)
  let o = 8
  events.forEach((e, i) => buf.writeInt32LE(e[0], o + 4 * i)); o += pad(4 * n)
  events.forEach((e, i) => buf.writeDoubleLE(e[1], o + 8 * i)); o += 8 * n
  for (let i = 0; i <= n; i++) buf.writeInt32LE(i, o + 4 * i)
  o += pad(4 * (n + 1))
  o += pad(4 * n) // tank index 0 for every event
  events.forEach((e, i) => buf.writeDoubleLE(e[1], o + 8 * i))
  return buf
}

export interface HandMadeRun {
  organisationId: string
  portfolioId: string
  assumptionVersionId: string
  years: number
  /** site id → events (simulated year, ground-up loss[, its property-damage part]) */
  siteEvents: Record<string, ([number, number] | [number, number, number])[]>
  /** Store the events in engine 1's layout (total only). */
  engine1?: boolean
  names?: Record<string, string>
}

export async function insertHandMadeRun(pool: pg.Pool, r: HandMadeRun): Promise<string> {
  const { rows: [run] } = await pool.query(
    `INSERT INTO runs (organisation_id, portfolio_id, portfolio_name, assumption_version_id, mode, seed, target_rse, max_samples_per_tank, years,
      chunk_size, sites_total, tanks_total, chunks_total, input_hash, engine_version, state, finished_at)
     VALUES ($1, $2, 'Terms fleet', $3, 'year', 7, 0.2, 4000, $4, 1, $5, $5, 1, 'hand-made', 'test', 'succeeded', now()) RETURNING id`,
    [r.organisationId, r.portfolioId, r.assumptionVersionId, r.years, Object.keys(r.siteEvents).length])
  let position = 0
  for (const [siteId, events] of Object.entries(r.siteEvents)) {
    position += 1
    await pool.query(`INSERT INTO run_site_snapshots (run_id, site_id, position, site, facts) VALUES ($1, $2, $3, '{}', $4)`,
      [run.id, siteId, position, JSON.stringify({ name: r.names?.[siteId] ?? `Site ${position}`, externalId: `X-${position}`, operatorName: 'Hand-made operator' })])
    await pool.query(
      `INSERT INTO run_site_results (run_id, site_id, radius_m, lambda_per_year, direct_rate, direct_lo, direct_hi, sparking_rate, sparking_lo, sparking_hi,
        ignition_rate, ignition_lo, ignition_hi, expected_annual_loss, expected_annual_loss_lo, expected_annual_loss_hi, direct_se, sparking_se, ignition_se,
        expected_annual_loss_se, samples, events)
       VALUES ($1, $2, 1000, 1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, $3, $4)`, [run.id, siteId, r.years, r.engine1 ? packEventsEngine1(events.map(e => [e[0], e[1]])) : packEvents(events)])
  }
  return run.id as string
}
