// A succeeded simulated-years run with hand-made loss events, written straight into the result
// tables, so that the financial view can be checked against figures worked out by hand.
import type pg from 'pg'
import { encodeEvents } from '../../server/runs/events-codec'

/** Packs events (year, loss), one tank per event, as the year mode stores them. */
export function packEvents(events: [number, number][]): Buffer {
  return encodeEvents({
    year: Int32Array.from(events.map(e => e[0])), loss: Float64Array.from(events.map(e => e[1])),
    tankStart: Int32Array.from({ length: events.length + 1 }, (_, i) => i), tankIndex: new Int32Array(events.length), tankLoss: Float64Array.from(events.map(e => e[1])),
  })
}

export interface HandMadeRun {
  organisationId: string
  portfolioId: string
  assumptionVersionId: string
  years: number
  /** site id → events (simulated year, ground-up loss) */
  siteEvents: Record<string, [number, number][]>
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
       VALUES ($1, $2, 1000, 1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, $3, $4)`, [run.id, siteId, r.years, packEvents(events)])
  }
  return run.id as string
}
