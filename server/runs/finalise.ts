// When every chunk is in: portfolio roll-ups (and year-mode exceedance), then the run succeeds.
import { asc, eq } from 'drizzle-orm'
import { sortDescending, STANDARD_RETURN_PERIODS, summariseYearLosses } from '../../shared/engine/exceedance'
import { returnPeriodLossInterval } from './quantile-interval'
import { useDb } from '../db'
import { runPortfolioResults, runs, runSiteResults } from '../db/schema'
import type { Figure } from './compute'
import { decodeEvents } from './events-codec'
import { sumCounts } from './figures'
import { normalEstimate, sumEstimates } from '../../shared/engine/statistics'

type SiteRow = typeof runSiteResults.$inferSelect

const figure = (r: SiteRow, p: 'direct' | 'sparking' | 'ignition'): Figure =>
  ({ rate: r[`${p}Rate`], se: r[`${p}Se`], lo: r[`${p}Lo`], hi: r[`${p}Hi`], count: r[`${p}Count`] ?? undefined })
const lossFigure = (r: SiteRow): Figure =>
  ({ rate: r.expectedAnnualLoss, se: r.expectedAnnualLossSe, lo: r.expectedAnnualLossLo, hi: r.expectedAnnualLossHi })

/** Year mode: the portfolio's year-loss table, built from every site's events in site-id order. */
function portfolioYearTable(rows: SiteRow[], years: number) {
  const yearLosses = new Float64Array(years)
  const yearMaxEventLoss = new Float64Array(years)
  for (const row of rows) {
    if (!row.events) continue
    const e = decodeEvents(row.events)
    for (let k = 0; k < e.year.length; k++) {
      const y = e.year[k]!
      yearLosses[y]! += e.loss[k]!
      if (e.loss[k]! > yearMaxEventLoss[y]!) yearMaxEventLoss[y] = e.loss[k]!
    }
  }
  return { yearLosses, yearMaxEventLoss }
}

/** Adds 95 % intervals to the losses at the standard return periods (aggregate and occurrence). */
function withIntervals<T extends object>(summary: T, table: { yearLosses: Float64Array, yearMaxEventLoss: Float64Array }) {
  const aggregate = sortDescending(table.yearLosses)
  const occurrence = sortDescending(table.yearMaxEventLoss)
  const intervals = (sorted: Float64Array) => STANDARD_RETURN_PERIODS.map(T => ({ returnPeriodYears: T, ...(returnPeriodLossInterval(sorted, T) ?? { lo: null, hi: null }) }))
  return { ...summary, intervals: { aggregate: intervals(aggregate), occurrence: intervals(occurrence) } }
}

/** Returns true when this call finalised the run (only one caller ever does). */
export async function finaliseRun(runId: string): Promise<boolean> {
  return useDb().transaction(async (tx) => {
    const [run] = await tx.select().from(runs).where(eq(runs.id, runId)).for('update')
    if (!run || run.state !== 'running' || run.chunksDone !== run.chunksTotal) return false
    // Fixed order (by site id) so that sums are bit-identical however the chunks were worked.
    const rows = await tx.select().from(runSiteResults).where(eq(runSiteResults.runId, runId)).orderBy(asc(runSiteResults.siteId))
    let values: { direct: Figure, sparking: Figure, ignition: Figure, eal: Figure, yearSummary: object | null }
    if (run.mode === 'frequency') {
      const eal = sumEstimates(rows.map(lossFigure))
      values = {
        direct: sumEstimates(rows.map(r => figure(r, 'direct'))),
        sparking: sumEstimates(rows.map(r => figure(r, 'sparking'))),
        ignition: sumEstimates(rows.map(r => figure(r, 'ignition'))),
        eal,
        yearSummary: null,
      }
    } else {
      const table = portfolioYearTable(rows, run.years)
      const summary = withIntervals(summariseYearLosses(table.yearLosses, table.yearMaxEventLoss), table)
      values = {
        direct: sumCounts(rows.map(r => figure(r, 'direct')), run.years),
        sparking: sumCounts(rows.map(r => figure(r, 'sparking')), run.years),
        ignition: sumCounts(rows.map(r => figure(r, 'ignition')), run.years),
        eal: normalEstimate(summary.averageAnnualLoss, summary.averageAnnualLossSe),
        yearSummary: summary,
      }
    }
    await tx.insert(runPortfolioResults).values({
      runId,
      directCount: values.direct.count ?? null, sparkingCount: values.sparking.count ?? null, ignitionCount: values.ignition.count ?? null,
      directRate: values.direct.rate, directLo: values.direct.lo, directHi: values.direct.hi, directSe: values.direct.se,
      sparkingRate: values.sparking.rate, sparkingLo: values.sparking.lo, sparkingHi: values.sparking.hi, sparkingSe: values.sparking.se,
      ignitionRate: values.ignition.rate, ignitionLo: values.ignition.lo, ignitionHi: values.ignition.hi, ignitionSe: values.ignition.se,
      expectedAnnualLoss: values.eal.rate, expectedAnnualLossLo: values.eal.lo, expectedAnnualLossHi: values.eal.hi, expectedAnnualLossSe: values.eal.se,
      yearSummary: values.yearSummary,
    }).onConflictDoNothing()
    await tx.update(runs).set({ state: 'succeeded', finishedAt: new Date() }).where(eq(runs.id, runId))
    return true
  })
}
