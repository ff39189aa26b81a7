// One site of a run through the engine, reduced to what the database stores. Pure: runs in worker
// threads (compute-task.ts) and in tests alike.
import type { AssumptionSet } from '../../shared/engine/assumptions'
import { parseSite } from '../../shared/engine/site-schema'
import { simulateSiteFrequency } from '../../shared/engine/frequency'
import { simulateSiteYears } from '../../shared/engine/years'
import type { SiteClustering } from '../../shared/engine/storm-clusters'
import { countEstimate, normalEstimate } from '../../shared/engine/statistics'
import type { CountEstimate, SiteInput } from '../../shared/engine/types'
import { figureFromCount, figureFromEstimate, type ResultFigure } from '../../shared/results/figure'
import { STANDARD_RETURN_PERIODS, type YearLossSummary } from '../../shared/engine/exceedance'
import type { PackedEvents, PackedSplit } from './events-codec'
import { RUN_EVENT_BANDS, siteEventBands, type SiteEventBands } from '../../shared/engine/heatmap'
import { prepareSiteOnce, type SitePreparation } from '../../shared/engine/prepared'
import { threadId } from 'node:worker_threads'
import { epochMs, type SiteThreadTiming } from './timing'
import { computeSiteDraws, computeSiteYearDraws, type SiteDraws } from './draws'

export type RunMode = 'frequency' | 'year'

export interface SiteTask {
  site: SiteInput
  assumptions: AssumptionSet
  mode: RunMode
  runSeed: number
  targetRse: number
  maxSamplesPerTank: number
  /** Frequency mode: the negligible-rate rule (/yr). */
  negligibleRatePerYear: number
  years: number
  /** Year mode with storm clustering: the site's place in the run's storm field; null otherwise. */
  clustering: SiteClustering | null
  /** Assumption uncertainty: K draws (0: none). Simulated years: bands only, each draw re-simulated (year-draws.ts). */
  assumptionDraws?: number
}

/**
 * A figure as computed: the shared result figure (shared/results/figure.ts) with its standard error.
 * Simulated years: `count` is the simulated count behind the rate and the interval is Garwood's.
 */
export type Figure = ResultFigure<number>

export interface TankComputation {
  tankId: string
  tag: string
  direct: Figure
  sparking: Figure
  ignition: Figure
  expectedAnnualLoss: Figure
  /** Property damage and business interruption parts of the expected annual loss (money/yr). */
  expectedAnnualLossPd: number
  expectedAnnualLossBi: number
  samples: number
  drivingComponentClass: string | null
  converged: boolean
}

export interface SiteComputation {
  siteId: string
  radiusM: number
  lambdaPerYear: number
  direct: Figure
  sparking: Figure
  ignition: Figure
  expectedAnnualLoss: Figure
  expectedAnnualLossPd: number
  expectedAnnualLossBi: number
  samples: number
  tanks: TankComputation[]
  /** Year mode: the total's summary, with the property-damage and interruption summaries beside it. */
  yearSummary: (YearLossSummary & { split: { propertyDamage: YearLossSummary, businessInterruption: YearLossSummary } }) | null
  events: (PackedEvents & { split: PackedSplit }) | null
  /** Tank events per year by current band × distance band (the site heatmap). */
  eventBands: SiteEventBands
  /** Where the thread's time went (ms, measured on the thread): compiling the site, the figures, the event bands. */
  timing: SiteTiming
  /** Runs with assumption draws: bands and sensitivity of the site and of its tanks; null otherwise. */
  draws: SiteDraws | null
}

export interface SiteTiming extends SiteThreadTiming {
  threadId: number
  prepareMs: number, figuresMs: number, eventBandsMs: number
}


const fromMean = (m: { mean: number, se: number }): Figure => figureFromEstimate(normalEstimate(m.mean, m.se))
const fromCount = figureFromCount

export function computeSite(task: SiteTask): SiteComputation {
  const startedAt = epochMs()
  const t0 = performance.now()
  // The snapshot is validated again here: a site that the engine cannot take fails with the reason.
  const checked = { ...task, site: parseSite(task.site) }
  // Compiled once for the task: the figures and the event bands share the site and its envelope.
  const prepared = prepareSiteOnce(checked.site, checked.assumptions)
  const t1 = performance.now()
  const figures = checked.mode === 'frequency' ? computeFrequency(checked, prepared) : computeYears(checked, prepared)
  const t2 = performance.now()
  const eventBands = siteEventBands(checked.site, checked.assumptions, { runSeed: checked.runSeed, ...RUN_EVENT_BANDS }, prepared)
  const t3 = performance.now()
  // Assumption draws count as figures in the timing (they are the same figures, K times over).
  const draws = checked.mode === 'frequency' && (checked.assumptionDraws ?? 0) > 0
    ? computeSiteDraws(checked.site, checked.assumptions, checked.assumptionDraws!, checked.runSeed, figures.tanks.map(t => ({
        direct: t.direct.rate, sparking: t.sparking.rate, ignition: t.ignition.rate, expectedAnnualLoss: t.expectedAnnualLoss.rate,
      })))
    : checked.mode === 'year' && (checked.assumptionDraws ?? 0) > 0 && figures.yearSummary
      ? computeSiteYearDraws(checked.site, checked.assumptions, checked.assumptionDraws!, checked.runSeed, checked.years, checked.clustering, {
          direct: figures.direct.rate, sparking: figures.sparking.rate, expectedFires: figures.ignition.rate,
          averageAnnualLoss: figures.yearSummary.averageAnnualLoss,
          aggregate: STANDARD_RETURN_PERIODS.map(T => figures.yearSummary!.aggregate.find(p => p.returnPeriodYears === T)?.loss ?? null),
          occurrence: STANDARD_RETURN_PERIODS.map(T => figures.yearSummary!.occurrence.find(p => p.returnPeriodYears === T)?.loss ?? null),
        })
      : null
  return { ...figures, eventBands, draws, timing: { threadId, startedAt, endedAt: epochMs(), prepareMs: t1 - t0, figuresMs: t2 - t1 + (performance.now() - t3), eventBandsMs: t3 - t2 } }
}

type SiteFigures = Omit<SiteComputation, 'eventBands' | 'timing' | 'draws'>

function computeFrequency(task: SiteTask, prepared: SitePreparation): SiteFigures {
  const r = simulateSiteFrequency(task.site, task.assumptions, {
    runSeed: task.runSeed, targetRse: task.targetRse, maxSamplesPerTank: task.maxSamplesPerTank,
    negligibleRatePerYear: task.negligibleRatePerYear,
  }, prepared)
  return {
    siteId: r.siteId,
    radiusM: r.radiusM,
    lambdaPerYear: r.lambdaPerYear,
    direct: figureFromEstimate(r.totals.direct),
    sparking: figureFromEstimate(r.totals.sparking),
    ignition: figureFromEstimate(r.totals.ignition),
    expectedAnnualLoss: figureFromEstimate(r.totals.expectedAnnualLoss),
    expectedAnnualLossPd: r.totals.expectedAnnualLossPd.rate,
    expectedAnnualLossBi: r.totals.expectedAnnualLossBi.rate,
    samples: r.samples,
    tanks: r.tanks.map(t => ({
      tankId: t.tankId, tag: t.tag,
      direct: figureFromEstimate(t.direct), sparking: figureFromEstimate(t.sparking), ignition: figureFromEstimate(t.ignition),
      expectedAnnualLoss: figureFromEstimate(t.expectedAnnualLoss),
      expectedAnnualLossPd: t.expectedAnnualLossPd.rate, expectedAnnualLossBi: t.expectedAnnualLossBi.rate,
      samples: t.samples, drivingComponentClass: t.drivingComponentClass, converged: t.converged,
    })),
    yearSummary: null,
    events: null,
  }
}

function computeYears(task: SiteTask, prepared: SitePreparation): SiteFigures {
  const r = simulateSiteYears(task.site, task.assumptions, { runSeed: task.runSeed, years: task.years, clustering: task.clustering }, prepared)
  const Y = r.years
  const sumCounts = (pick: (t: typeof r.tanks[number]) => CountEstimate) => r.tanks.reduce((n, t) => n + pick(t).count, 0)
  // Counts over the same simulated years add; the site's interval is Garwood's on the sum, as for tanks.
  const siteCount = (n: number): Figure => fromCount(countEstimate(n, Y), Y)
  return {
    siteId: r.siteId,
    radiusM: r.radiusM,
    lambdaPerYear: r.lambdaPerYear,
    direct: siteCount(sumCounts(t => t.direct)),
    sparking: siteCount(sumCounts(t => t.sparking)),
    ignition: siteCount(sumCounts(t => t.ignition)),
    expectedAnnualLoss: fromMean({ mean: r.summary.averageAnnualLoss, se: r.summary.averageAnnualLossSe }),
    expectedAnnualLossPd: r.propertyDamage.summary.averageAnnualLoss,
    expectedAnnualLossBi: r.businessInterruption.summary.averageAnnualLoss,
    samples: r.candidates,
    tanks: r.tanks.map(t => ({
      tankId: t.tankId, tag: t.tag,
      direct: fromCount(t.direct, Y), sparking: fromCount(t.sparking, Y), ignition: fromCount(t.ignition, Y),
      expectedAnnualLoss: fromMean(t.averageAnnualLoss),
      expectedAnnualLossPd: t.averageAnnualLossPd.mean, expectedAnnualLossBi: t.averageAnnualLossBi.mean,
      samples: r.candidates, drivingComponentClass: null, converged: true,
    })),
    yearSummary: { ...r.summary, split: { propertyDamage: r.propertyDamage.summary, businessInterruption: r.businessInterruption.summary } },
    events: {
      year: r.events.year, loss: r.events.loss, tankStart: r.events.tankStart, tankIndex: r.events.tankIndex, tankLoss: r.events.tankLoss,
      split: { propertyDamage: r.events.propertyDamage, tankPropertyDamage: r.events.tankPropertyDamage, tankBySpread: r.events.tankBySpread },
    },
  }
}
