// When every chunk is in: portfolio roll-ups (and year-mode exceedance), then the run succeeds.
import { and, asc, eq, inArray } from 'drizzle-orm'
import { sortDescending, STANDARD_RETURN_PERIODS, summariseYearLosses } from '../../shared/engine/exceedance'
import { returnPeriodLossInterval } from './quantile-interval'
import { useDb, type Database } from '../db'
import { assumptionSetVersions, runPortfolioResults, runs, runSiteResults } from '../db/schema'
import { parseAssumptions, type AssumptionSet } from '../../shared/engine/assumptions'
import { evaluationCount } from '../../shared/engine/draws'
import { bandOf, DRAW_METRICS, drawsOf, sensitivityOf, type DrawBands, type DrawMetric } from '../../shared/engine/draw-figures'
import type { StoredPortfolioDraws, StoredSiteDraws } from '../../shared/results/draws'
import { decodeSeries, decodeYearTables, runDrawPlan } from './draws'
import { DRAW_YEARS, yearDrawBands, type YearDrawFigures } from '../../shared/engine/year-draws'
import type { Figure } from './compute'
import { decodeEvents } from './events-codec'
import { sitesIndependentYears } from '../../shared/engine/storm-clusters'
import { sumCounts } from './figures'
import { figureValues, selectFigures, toFigures } from '../results/figures'
import type { StoredYearSummary } from '../results/queries'
import { figureFromEstimate, type FigureName } from '../../shared/results/figure'
import { normalEstimate, sumEstimates } from '../../shared/engine/statistics'

/** What the roll-up reads of each site: its figures (with standard errors and counts) and the PD / BI split. */
const siteColumns = {
  siteId: runSiteResults.siteId,
  ...selectFigures(runSiteResults),
  expectedAnnualLossPd: runSiteResults.expectedAnnualLossPd, expectedAnnualLossBi: runSiteResults.expectedAnnualLossBi,
}

interface Table { yearLosses: Float64Array, yearMaxEventLoss: Float64Array }
const emptyTable = (years: number): Table => ({ yearLosses: new Float64Array(years), yearMaxEventLoss: new Float64Array(years) })
function addEvent(t: Table, y: number, loss: number) {
  t.yearLosses[y]! += loss
  if (loss > t.yearMaxEventLoss[y]!) t.yearMaxEventLoss[y] = loss
}

/** Sites whose event blobs are read at once while the portfolio's tables are built (bounded memory). */
const EVENT_PAGE = 200

/**
 * Year mode: the portfolio's year-loss tables (total, property damage, business interruption),
 * built from every site's events in site-id order — read a page of sites at a time, so a run of
 * thousands of sites never holds every site's events at once (the order, and so every sum, is the same).
 */
async function portfolioYearTables(tx: Database, runId: string, siteIds: string[], years: number, independentSeed: number | null) {
  const total = emptyTable(years)
  const pd = emptyTable(years)
  const bi = emptyTable(years)
  // With storm clustering: the same site losses with each site's years shuffled (sites independent).
  const independent = independentSeed === null ? null : emptyTable(years)
  for (let i = 0; i < siteIds.length; i += EVENT_PAGE) {
    const page = await tx.select({ siteId: runSiteResults.siteId, events: runSiteResults.events }).from(runSiteResults)
      .where(and(eq(runSiteResults.runId, runId), inArray(runSiteResults.siteId, siteIds.slice(i, i + EVENT_PAGE))))
      .orderBy(asc(runSiteResults.siteId))
    for (const row of page) {
      if (!row.events) continue
      const e = decodeEvents(row.events)
      for (let k = 0; k < e.year.length; k++) {
        const y = e.year[k]!
        addEvent(total, y, e.loss[k]!)
        const p = e.split ? e.split.propertyDamage[k]! : 0
        addEvent(pd, y, p)
        addEvent(bi, y, e.loss[k]! - p)
      }
      if (independent) {
        const shuffled = sitesIndependentYears(e.year, years, independentSeed!, row.siteId)
        for (let k = 0; k < shuffled.length; k++) addEvent(independent, shuffled[k]!, e.loss[k]!)
      }
    }
  }
  return { total, pd, bi, independent }
}

/** Adds 95 % intervals to the losses at the standard return periods (aggregate and occurrence). */
function withIntervals<T extends object>(summary: T, table: { yearLosses: Float64Array, yearMaxEventLoss: Float64Array }) {
  const aggregate = sortDescending(table.yearLosses)
  const occurrence = sortDescending(table.yearMaxEventLoss)
  const intervals = (sorted: Float64Array) => STANDARD_RETURN_PERIODS.map(T => ({ returnPeriodYears: T, ...(returnPeriodLossInterval(sorted, T) ?? { lo: null, hi: null }) }))
  return { ...summary, intervals: { aggregate: intervals(aggregate), occurrence: intervals(occurrence) } }
}

/** Each site's stored draws, a page at a time in site-id order (so sums are the same whatever the workers). */
async function forEachSiteDraws(tx: Database, runId: string, siteIds: string[], each: (draws: StoredSiteDraws) => void): Promise<void> {
  for (let i = 0; i < siteIds.length; i += EVENT_PAGE) {
    const page = await tx.select({ draws: runSiteResults.draws }).from(runSiteResults)
      .where(and(eq(runSiteResults.runId, runId), inArray(runSiteResults.siteId, siteIds.slice(i, i + EVENT_PAGE))))
      .orderBy(asc(runSiteResults.siteId))
    for (const row of page) if (row.draws) each(row.draws)
  }
}

/** Adds a site's per-evaluation figures into the portfolio's sums. */
function addSeries(sums: Record<DrawMetric, Float64Array>, d: StoredSiteDraws, E: number): void {
  for (const m of DRAW_METRICS) {
    const v = decodeSeries(d.series[m], E)
    const into = sums[m]
    for (let e = 0; e < E; e++) into[e]! += v[e]!
  }
}

/**
 * Runs with assumption draws: the portfolio's figure per evaluation is the sum of the sites' (site-id
 * order, a page at a time), its bands the 5/50/95 % points over the draws, its sensitivity indices
 * from the whole design.
 */
async function portfolioDraws(tx: Database, runId: string, siteIds: string[], assumptions: AssumptionSet, draws: number, seed: number): Promise<StoredPortfolioDraws> {
  const plan = runDrawPlan(assumptions, draws, seed)
  const E = evaluationCount(plan)
  const sums = Object.fromEntries(DRAW_METRICS.map(m => [m, new Float64Array(E)])) as Record<DrawMetric, Float64Array>
  await forEachSiteDraws(tx, runId, siteIds, (d) => { addSeries(sums, d, E) })
  return {
    draws, evaluations: E, clamped: plan.clamped, leftOut: plan.leftOut,
    bands: Object.fromEntries(DRAW_METRICS.map(m => [m, bandOf(drawsOf(sums[m], draws))])) as DrawBands,
    sensitivity: [sensitivityOf(sums.ignition, plan, 'expectedFires', `${seed}|portfolio`), sensitivityOf(sums.expectedAnnualLoss, plan, 'aal', `${seed}|portfolio`)],
  }
}

/**
 * Simulated-years runs with draws: the portfolio's four figures per draw are the sums of the sites'
 * (each already central × X_k / X_0 site by site); its return-period losses come from the sites'
 * re-simulated year-loss tables added year by year per evaluation (the years are shared across the
 * sites of a run), anchored on the portfolio's central figures as central × X_k / X_0.
 */
async function portfolioYearDraws(tx: Database, runId: string, siteIds: string[], draws: number, years: number, central: YearDrawFigures): Promise<StoredPortfolioDraws> {
  const E = 1 + draws
  const Yd = Math.min(years, DRAW_YEARS)
  const sums = Object.fromEntries(DRAW_METRICS.map(m => [m, new Float64Array(E)])) as Record<DrawMetric, Float64Array>
  const tables = Array.from({ length: E }, () => ({ yearLosses: new Float64Array(Yd), yearMaxEventLoss: new Float64Array(Yd) }))
  await forEachSiteDraws(tx, runId, siteIds, (d) => {
    addSeries(sums, d, E)
    const q = d.yearTables ? decodeYearTables(d.yearTables) : new Float64Array(0)
    for (let j = 0; j + 3 < q.length; j += 4) {
      const t = tables[q[j]!]!, y = q[j + 1]!
      t.yearLosses[y]! += q[j + 2]!
      if (q[j + 3]! > t.yearMaxEventLoss[y]!) t.yearMaxEventLoss[y] = q[j + 3]!
    }
  })
  const at = (table: { returnPeriodYears: number, loss: number | null }[], T: number) => table.find(p => p.returnPeriodYears === T)?.loss ?? null
  const evaluations = tables.map((t, e) => {
    const summary = summariseYearLosses(t.yearLosses, t.yearMaxEventLoss)
    return { averageAnnualLoss: summary.averageAnnualLoss, expectedFires: sums.ignition[e]!, aggregate: STANDARD_RETURN_PERIODS.map(T => at(summary.aggregate, T)), occurrence: STANDARD_RETURN_PERIODS.map(T => at(summary.occurrence, T)) }
  })
  const bands = yearDrawBands({ years: Yd, returnPeriods: STANDARD_RETURN_PERIODS, evaluations, tables }, central)
  return {
    draws, evaluations: E, clamped: 0, sensitivity: [],
    bands: Object.fromEntries(DRAW_METRICS.map(m => [m, bandOf(sums[m].subarray(1))])) as DrawBands,
    // AAL and expected fires: the sums of the sites' adjusted figures (the bands above); the return periods from the added tables.
    years: { ...bands, averageAnnualLoss: bandOf(sums.expectedAnnualLoss.subarray(1)), expectedFires: bandOf(sums.ignition.subarray(1)) },
  }
}

/** Returns true when this call finalised the run (only one caller ever does). */
export async function finaliseRun(runId: string): Promise<boolean> {
  return useDb().transaction(async (tx) => {
    const [run] = await tx.select().from(runs).where(eq(runs.id, runId)).for('update')
    if (!run || run.state !== 'running' || run.chunksDone !== run.chunksTotal) return false
    // Fixed order (by site id) so that sums are bit-identical however the chunks were worked.
    // The figures only: the per-site blobs (events, event bands, year summaries) are not read here.
    const rows = (await tx.select(siteColumns).from(runSiteResults).where(eq(runSiteResults.runId, runId)).orderBy(asc(runSiteResults.siteId)))
      .map(r => ({ siteId: r.siteId, expectedAnnualLossPd: r.expectedAnnualLossPd, expectedAnnualLossBi: r.expectedAnnualLossBi, figures: toFigures(r) }))
    let values: { pd: number, bi: number, direct: Figure, sparking: Figure, ignition: Figure, eal: Figure, yearSummary: StoredYearSummary | null }
    const splitSum = (key: 'expectedAnnualLossPd' | 'expectedAnnualLossBi') => rows.reduce((s, r) => s + (r[key] ?? 0), 0)
    const pd = splitSum('expectedAnnualLossPd')
    const bi = splitSum('expectedAnnualLossBi')
    if (run.mode === 'frequency') {
      const sum = (name: FigureName) => figureFromEstimate(sumEstimates(rows.map(r => r.figures[name])))
      values = {
        pd, bi,
        direct: sum('direct'),
        sparking: sum('sparking'),
        ignition: sum('ignition'),
        eal: sum('expectedAnnualLoss'),
        yearSummary: null,
      }
    } else {
      const tables = await portfolioYearTables(tx, runId, rows.map(r => r.siteId), run.years, run.stormClustering ? run.seed : null)
      const table = tables.total
      const summary = {
        ...withIntervals(summariseYearLosses(table.yearLosses, table.yearMaxEventLoss), table),
        split: {
          propertyDamage: withIntervals(summariseYearLosses(tables.pd.yearLosses, tables.pd.yearMaxEventLoss), tables.pd),
          businessInterruption: withIntervals(summariseYearLosses(tables.bi.yearLosses, tables.bi.yearMaxEventLoss), tables.bi),
        },
        ...(tables.independent ? { sitesIndependent: withIntervals(summariseYearLosses(tables.independent.yearLosses, tables.independent.yearMaxEventLoss), tables.independent) } : {}),
      }
      values = {
        pd: summary.split.propertyDamage.averageAnnualLoss, bi: summary.split.businessInterruption.averageAnnualLoss,
        direct: sumCounts(rows.map(r => r.figures.direct), run.years),
        sparking: sumCounts(rows.map(r => r.figures.sparking), run.years),
        ignition: sumCounts(rows.map(r => r.figures.ignition), run.years),
        eal: figureFromEstimate(normalEstimate(summary.averageAnnualLoss, summary.averageAnnualLossSe)),
        yearSummary: summary,
      }
    }
    let draws: StoredPortfolioDraws | null = null
    if (run.assumptionDraws > 0 && run.mode === 'frequency') {
      const [version] = await tx.select({ parameters: assumptionSetVersions.parameters }).from(assumptionSetVersions).where(eq(assumptionSetVersions.id, run.assumptionVersionId))
      draws = await portfolioDraws(tx, runId, rows.map(r => r.siteId), parseAssumptions(version!.parameters), run.assumptionDraws, run.seed)
    } else if (run.assumptionDraws > 0 && values.yearSummary) {
      const ys = values.yearSummary
      const at = (table: { returnPeriodYears: number, loss: number | null }[], T: number) => table.find(p => p.returnPeriodYears === T)?.loss ?? null
      draws = await portfolioYearDraws(tx, runId, rows.map(r => r.siteId), run.assumptionDraws, run.years, {
        averageAnnualLoss: ys.averageAnnualLoss, expectedFires: values.ignition.rate,
        aggregate: STANDARD_RETURN_PERIODS.map(T => at(ys.aggregate, T)), occurrence: STANDARD_RETURN_PERIODS.map(T => at(ys.occurrence, T)),
      })
    }
    await tx.insert(runPortfolioResults).values({
      draws,
      runId,
      ...figureValues({ direct: values.direct, sparking: values.sparking, ignition: values.ignition, expectedAnnualLoss: values.eal }),
      expectedAnnualLossPd: values.pd, expectedAnnualLossBi: values.bi,
      yearSummary: values.yearSummary,
    }).onConflictDoNothing()
    await tx.update(runs).set({ state: 'succeeded', finishedAt: new Date() }).where(eq(runs.id, runId))
    return true
  })
}
