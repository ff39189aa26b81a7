// Stored results of succeeded runs, shaped for the result views (shared/results/types.ts).
// Failed and cancelled runs have no results: every query starts from a succeeded run.
import { and, asc, desc, eq, sql } from 'drizzle-orm'
import { useDb } from '../db'
import { assumptionSetVersions, runPortfolioResults, runs, runSiteResults, runSiteSnapshots, runTankResults } from '../db/schema'
import type { SiteInput } from '../../shared/engine/types'
import { parseAssumptions } from '../../shared/engine/assumptions'
import { spreadNeighbours, type SpreadNeighbour } from '../../shared/engine/loss'
import type { ResultFigure } from '../../shared/results/figure'
import { selectFigures, selectTankFigures, toFigures, type ResultFigures } from './figures'

import type { DrawsView } from '../../shared/results/draws'

export type RunRow = typeof runs.$inferSelect

export interface RangedFigure { value: number, lo: number | null, hi: number | null }

interface ReturnPeriodRow { returnPeriodYears: number, loss: number | null, tailValueAtRisk: number | null }
interface IntervalRow { returnPeriodYears: number, lo: number | null, hi: number | null }
export interface StoredYearSummary {
  years: number
  averageAnnualLoss: number
  aggregate: ReturnPeriodRow[]
  occurrence: ReturnPeriodRow[]
  aggregateCurve: { returnPeriodYears: number, loss: number }[]
  occurrenceCurve: { returnPeriodYears: number, loss: number }[]
  intervals?: { aggregate: IntervalRow[], occurrence: IntervalRow[] }
  /** Engine 2 and later: the same summary for property damage and for business interruption. */
  split?: { propertyDamage: StoredYearSummary, businessInterruption: StoredYearSummary }
  /**
   * Runs with storm clustering: the portfolio of the same site year-loss tables with each site's
   * years shuffled — the sites independent — beside the joint one, to show the accumulation.
   */
  sitesIndependent?: StoredYearSummary
}

export const TAIL_RETURN_PERIOD = 250

export async function findSucceededRun(organisationId: string, runId: string): Promise<RunRow | null> {
  const [run] = await useDb().select().from(runs).where(and(eq(runs.id, runId), eq(runs.organisationId, organisationId), eq(runs.state, 'succeeded')))
  return run ?? null
}

/** The newest succeeded run of the organisation (optionally of one portfolio). */
export async function latestSucceededRun(organisationId: string, portfolioId?: string): Promise<RunRow | null> {
  const [run] = await useDb().select().from(runs)
    .where(and(eq(runs.organisationId, organisationId), eq(runs.state, 'succeeded'), portfolioId ? eq(runs.portfolioId, portfolioId) : undefined))
    .orderBy(desc(runs.finishedAt)).limit(1)
  return run ?? null
}

const ranged = (value: number, lo: number | null, hi: number | null): RangedFigure => ({ value, lo, hi })
const none: RangedFigure = { value: Number.NaN, lo: null, hi: null }

function atPeriod(summary: StoredYearSummary | null, T: number): RangedFigure {
  const row = summary?.aggregate.find(r => r.returnPeriodYears === T)
  if (!row || row.loss === null) return none
  const interval = summary?.intervals?.aggregate.find(r => r.returnPeriodYears === T)
  return ranged(row.loss, interval?.lo ?? null, interval?.hi ?? null)
}

/** The headline figures of a portfolio or a site: its result figures, PD / BI split and year summary. */
export function headline(f: ResultFigures, split: LossSplit | null, summary: StoredYearSummary | null) {
  const tail = summary?.aggregate.find(r => r.returnPeriodYears === TAIL_RETURN_PERIOD)?.tailValueAtRisk ?? null
  const of = (x: ResultFigure) => ranged(x.rate, x.lo, x.hi)
  return {
    ignitionPerYear: of(f.ignition),
    sparkingPerYear: of(f.sparking),
    directPerYear: of(f.direct),
    averageAnnualLoss: of(f.expectedAnnualLoss),
    lossAt100Years: atPeriod(summary, 100),
    lossAt250Years: atPeriod(summary, 250),
    tailValueAtRisk: tail === null ? none : ranged(tail, null, null),
    tailReturnPeriodYears: TAIL_RETURN_PERIOD,
    averageAnnualLossSplit: split,
  }
}

/** PD / BI of a result row, or null for a run stored before the split (total only). */
export function lossSplit(p: { expectedAnnualLossPd?: number | null, expectedAnnualLossBi?: number | null }): LossSplit | null {
  return p.expectedAnnualLossPd === null || p.expectedAnnualLossPd === undefined || p.expectedAnnualLossBi === null || p.expectedAnnualLossBi === undefined
    ? null
    : { propertyDamage: p.expectedAnnualLossPd, businessInterruption: p.expectedAnnualLossBi }
}

export function exceedanceSeries(summary: StoredYearSummary | null, name: string) {
  if (!summary) return []
  if (summary.sitesIndependent) name = `${name}, storm clustering`
  const series = [
    { name, kind: 'aggregate' as const, points: summary.aggregateCurve.map(p => ({ returnPeriodYears: p.returnPeriodYears, loss: p.loss })) },
    { name, kind: 'occurrence' as const, points: summary.occurrenceCurve.map(p => ({ returnPeriodYears: p.returnPeriodYears, loss: p.loss })) },
  ]
  if (summary.sitesIndependent) {
    series.push({ name: `${name}, sites independent (each site's years shuffled)`, kind: 'aggregate' as const, points: summary.sitesIndependent.aggregateCurve.map(p => ({ returnPeriodYears: p.returnPeriodYears, loss: p.loss })) })
  }
  if (summary.split) {
    for (const [label, part] of [['property damage', summary.split.propertyDamage], ['business interruption', summary.split.businessInterruption]] as const) {
      series.push({ name: `${name}, ${label}`, kind: 'aggregate' as const, points: part.aggregateCurve.map(p => ({ returnPeriodYears: p.returnPeriodYears, loss: p.loss })) })
    }
  }
  return series
}

/** A clustered run's tail with the sites' storms shared (joint) and with the sites independent, at 100 and 250 years. */
export function accumulationOf(summary: StoredYearSummary | null) {
  if (!summary?.sitesIndependent) return null
  const pick = (s: StoredYearSummary) => ({
    averageAnnualLoss: s.averageAnnualLoss,
    returnPeriods: [100, 250].map(T => {
      const row = s.aggregate.find(r => r.returnPeriodYears === T)
      const interval = s.intervals?.aggregate.find(r => r.returnPeriodYears === T)
      return { returnPeriodYears: T, loss: row?.loss ?? null, lo: interval?.lo ?? null, hi: interval?.hi ?? null, tailValueAtRisk: row?.tailValueAtRisk ?? null }
    }),
  })
  return { joint: pick(summary), sitesIndependent: pick(summary.sitesIndependent) }
}

export interface LossSplit { propertyDamage: number, businessInterruption: number }

/** A run's portfolio figures (with standard errors), PD / BI split (null: total only) and year summary. */
export async function portfolioResult(runId: string) {
  const [row] = await useDb().select({
    ...selectFigures(runPortfolioResults),
    expectedAnnualLossPd: runPortfolioResults.expectedAnnualLossPd, expectedAnnualLossBi: runPortfolioResults.expectedAnnualLossBi,
    yearSummary: runPortfolioResults.yearSummary,
    draws: runPortfolioResults.draws,
  }).from(runPortfolioResults).where(eq(runPortfolioResults.runId, runId))
  if (!row) return null
  return { figures: toFigures(row), lossSplit: lossSplit(row), yearSummary: row.yearSummary, draws: row.draws ?? null }
}
export type PortfolioResult = NonNullable<Awaited<ReturnType<typeof portfolioResult>>>

/** Every site of a run with its figures and the facts frozen at the start of the run. */
export async function siteResults(runId: string) {
  const rows = await useDb().select({
    siteId: runSiteResults.siteId, facts: runSiteSnapshots.facts,
    ...selectFigures(runSiteResults),
    expectedAnnualLossPd: runSiteResults.expectedAnnualLossPd, expectedAnnualLossBi: runSiteResults.expectedAnnualLossBi,
    radiusM: runSiteResults.radiusM, lambdaPerYear: runSiteResults.lambdaPerYear,
    lossAt100: sql<number | null>`(${runSiteResults.yearSummary} -> 'aggregate' -> 3 ->> 'loss')::float8`,
    tanks: sql<number>`jsonb_array_length(${runSiteSnapshots.site} -> 'tanks')`,
    bands: sql<DrawsView['bands'] | null>`${runSiteResults.draws} -> 'bands'`,
  }).from(runSiteResults)
    .innerJoin(runSiteSnapshots, and(eq(runSiteSnapshots.runId, runSiteResults.runId), eq(runSiteSnapshots.siteId, runSiteResults.siteId)))
    .where(eq(runSiteResults.runId, runId))
    .orderBy(desc(runSiteResults.ignitionRate), asc(runSiteResults.siteId))
  return rows.map(r => ({
    siteId: r.siteId, facts: r.facts, figures: toFigures(r), lossSplit: lossSplit(r),
    radiusM: r.radiusM, lambdaPerYear: r.lambdaPerYear, lossAt100: r.lossAt100, tanks: r.tanks,
    /** Assumption band (5/50/95 % across draws) per figure; null: no assumption draws. */
    assumptionBands: r.bands ?? null,
  }))
}
export type SiteResult = Awaited<ReturnType<typeof siteResults>>[number]

/** What a tank row holds besides its figures. */
const tankColumns = {
  tankId: runTankResults.tankId, siteId: runTankResults.siteId, tag: runTankResults.tag,
  ...selectTankFigures(runTankResults),
  upperBoundFigures: runTankResults.upperBoundFigures,
  expectedAnnualLossPd: runTankResults.expectedAnnualLossPd, expectedAnnualLossBi: runTankResults.expectedAnnualLossBi,
  samples: runTankResults.samples, drivingComponentClass: runTankResults.drivingComponentClass, converged: runTankResults.converged,
  draws: runTankResults.draws,
}

function tankResult(r: Awaited<ReturnType<typeof selectTanks>>[number]) {
  return {
    tankId: r.tankId, siteId: r.siteId, tag: r.tag,
    // A figure stopped by the negligible-rate rule is an upper bound (upperBoundOnly).
    figures: toFigures(r, r.upperBoundFigures), lossSplit: lossSplit(r),
    samples: r.samples, drivingComponentClass: r.drivingComponentClass, converged: r.converged,
    /** Assumption band (5/50/95 % across draws) of each figure; null: the run had no assumption draws. */
    draws: r.draws ?? null,
  }
}
const selectTanks = () => useDb().select(tankColumns).from(runTankResults)
export type TankResult = ReturnType<typeof tankResult>

/** Every tank of a run (by site, then tag), with its figures. */
export async function tankResults(runId: string): Promise<TankResult[]> {
  const rows = await selectTanks().where(eq(runTankResults.runId, runId)).orderBy(runTankResults.siteId, runTankResults.tag)
  return rows.map(tankResult)
}

/** The sites with the most expected fires in a run (served by the run × ignition index). */
export async function topSites(runId: string, limit: number) {
  return useDb().select({
    siteId: runSiteResults.siteId, ignitionRate: runSiteResults.ignitionRate,
    name: sql<string>`${runSiteSnapshots.facts} ->> 'name'`,
    operatorName: sql<string>`${runSiteSnapshots.facts} ->> 'operatorName'`,
    tanks: sql<number>`jsonb_array_length(${runSiteSnapshots.site} -> 'tanks')`,
  }).from(runSiteResults)
    .innerJoin(runSiteSnapshots, and(eq(runSiteSnapshots.runId, runSiteResults.runId), eq(runSiteSnapshots.siteId, runSiteResults.siteId)))
    .where(eq(runSiteResults.runId, runId))
    .orderBy(desc(runSiteResults.ignitionRate), asc(runSiteResults.siteId)).limit(limit)
}

/** The tanks with the most expected fires in a run (served by the run × ignition index). */
export async function topTanks(runId: string, limit: number) {
  return useDb().select({
    tankId: runTankResults.tankId, siteId: runTankResults.siteId, tag: runTankResults.tag,
    ignitionRate: runTankResults.ignitionRate, expectedAnnualLoss: runTankResults.expectedAnnualLoss,
    siteName: sql<string>`${runSiteSnapshots.facts} ->> 'name'`,
  }).from(runTankResults)
    .innerJoin(runSiteSnapshots, and(eq(runSiteSnapshots.runId, runTankResults.runId), eq(runSiteSnapshots.siteId, runTankResults.siteId)))
    .where(eq(runTankResults.runId, runId))
    .orderBy(desc(runTankResults.ignitionRate), asc(runTankResults.tankId)).limit(limit)
}

/** One site of a run: its figures, its tanks' figures and its snapshot (engine input and facts). */
export async function siteDetail(runId: string, siteId: string) {
  const [row] = await useDb().select({
    ...selectFigures(runSiteResults),
    expectedAnnualLossPd: runSiteResults.expectedAnnualLossPd, expectedAnnualLossBi: runSiteResults.expectedAnnualLossBi,
    radiusM: runSiteResults.radiusM, yearSummary: runSiteResults.yearSummary, eventBands: runSiteResults.eventBands,
    // the bands and indices only: the per-evaluation series stay in the database
    draws: sql<DrawsView | null>`${runSiteResults.draws} - 'series' - 'yearTables'`,
    site: runSiteSnapshots.site, facts: runSiteSnapshots.facts,
  }).from(runSiteResults)
    .innerJoin(runSiteSnapshots, and(eq(runSiteSnapshots.runId, runSiteResults.runId), eq(runSiteSnapshots.siteId, runSiteResults.siteId)))
    .where(and(eq(runSiteResults.runId, runId), eq(runSiteResults.siteId, siteId)))
  if (!row) return null
  const tanks = await selectTanks()
    .where(and(eq(runTankResults.runId, runId), eq(runTankResults.siteId, siteId))).orderBy(desc(runTankResults.ignitionRate))
  return {
    result: {
      figures: toFigures(row), lossSplit: lossSplit(row), radiusM: row.radiusM, eventBands: row.eventBands,
      yearSummary: row.yearSummary,
      draws: row.draws ?? null,
    },
    site: row.site,
    facts: row.facts,
    tanks: tanks.map(tankResult),
  }
}

/**
 * The neighbours each tank's fire would most likely reach, by the run's own assumptions (tank id →
 * the three most likely). `modelled` is false when the run's assumptions predate fire spread
 * (engine 1) or switch it off.
 */
export async function runSpreadNeighbours(run: RunRow, site: SiteInput): Promise<{ modelled: boolean, byTank: Record<string, SpreadNeighbour[]> }> {
  const [version] = await useDb().select({ parameters: assumptionSetVersions.parameters }).from(assumptionSetVersions).where(eq(assumptionSetVersions.id, run.assumptionVersionId))
  const stored = (version?.parameters ?? {}) as Record<string, unknown>
  if (!('fireSpread' in stored)) return { modelled: false, byTank: {} }
  const assumptions = parseAssumptions(stored)
  if (assumptions.fireSpread.model === 'off') return { modelled: false, byTank: {} }
  const lists = spreadNeighbours(site, assumptions)
  return { modelled: true, byTank: Object.fromEntries(site.tanks.map((t, i) => [t.id, lists[i]!.slice(0, 3)])) }
}
