// The financial view of a succeeded year-mode run, computed on request from the stored loss events
// (nothing is cached: a thousand sites' events take milliseconds), with an optional deductible
// what-if evaluated on the same events without a new simulation.
import { and, asc, eq } from 'drizzle-orm'
import { computeFinancials, type PortfolioFinancials, type SiteLosses } from '../../shared/insurance/financials'
import type { PricingBasis } from '../../shared/insurance/pricing'
import type { SiteTerms } from '../../shared/insurance/terms'
import type { FinancialQuery } from '../../shared/schemas/insurance'
import type { YearLossSummary } from '../../shared/engine/exceedance'
import { useDb } from '../db'
import { assumptionSets, assumptionSetVersions, runs, runSiteResults, runSiteSnapshots, users } from '../db/schema'
import { decodeEvents, type DecodedEvents } from '../runs/events-codec'
import type { PortfolioLayer } from '../../shared/insurance/layers'
import { NO_TERMS } from '../../shared/insurance/terms'
import { tankSeverity } from '../../shared/engine/ignition'
import type { TankInput } from '../../shared/engine/types'
import { findTermsVersion, layersOf, runTermsVersionId, termsBySite } from './terms-store'
import { AppError } from '../utils/errors'
import { sitesIndependentYears } from '../../shared/engine/storm-clusters'

export interface FinancialInputs {
  run: typeof runs.$inferSelect
  requestedByName: string | null
  assumptions: { versionId: string, setName: string, version: number }
  terms: { versionId: string, setId: string, setName: string, version: number, recordedByRun: boolean } | null
  sites: (SiteLosses & { name: string, externalId: string, operatorName: string, describe: (event: number) => EventDetail })[]
  layers: PortfolioLayer[]
}

/** What burned in one event: the tanks (by tag, and whether by spread) and their value at risk. */
export interface EventDetail { valueAtRisk: number | null, tanks: { tag: string, bySpread: boolean }[] }

function eventDescriber(events: DecodedEvents, snapshotTanks: TankInput[] | undefined) {
  return (k: number): EventDetail => {
    const tanks: EventDetail['tanks'] = []
    let valueAtRisk: number | null = snapshotTanks ? 0 : null
    for (let i = events.tankStart[k]!; i < events.tankStart[k + 1]!; i++) {
      const tank = snapshotTanks?.[events.tankIndex[i]!]
      tanks.push({ tag: tank?.tag ?? `#${events.tankIndex[i]! + 1}`, bySpread: events.split?.tankBySpread[i] === 1 })
      if (valueAtRisk !== null) valueAtRisk = tank ? valueAtRisk + tankSeverity(tank) : null
    }
    return { valueAtRisk, tanks }
  }
}

/** Run, terms and every site's events, scoped to the organisation. */
export async function loadFinancialInputs(organisationId: string, runId: string, termsVersionId?: string): Promise<FinancialInputs> {
  const db = useDb()
  const [row] = await db.select({ run: runs, requestedByName: users.name, setName: assumptionSets.name, version: assumptionSetVersions.version }).from(runs)
    .leftJoin(users, eq(users.id, runs.requestedBy))
    .innerJoin(assumptionSetVersions, eq(assumptionSetVersions.id, runs.assumptionVersionId))
    .innerJoin(assumptionSets, eq(assumptionSets.id, assumptionSetVersions.assumptionSetId))
    .where(and(eq(runs.id, runId), eq(runs.organisationId, organisationId), eq(runs.state, 'succeeded')))
  if (!row) throw new AppError(404, 'Results of this run not found.')
  if (row.run.mode !== 'year') throw new AppError(400, 'The financial view needs a simulated-years run: a frequency run keeps no loss events. Start a run in simulated-years mode.')
  const recorded = await runTermsVersionId(db, runId)
  const chosen = termsVersionId ?? recorded
  let terms: FinancialInputs['terms'] = null
  let bySite = new Map<string, SiteTerms>()
  let layers: PortfolioLayer[] = []
  if (chosen) {
    const version = await findTermsVersion(db, organisationId, chosen)
    if (!version) throw new AppError(404, 'Terms version not found.')
    terms = { versionId: version.version.id, setId: version.set.id, setName: version.set.name, version: version.version.version, recordedByRun: chosen === recorded }
    bySite = await termsBySite(db, chosen)
    layers = await layersOf(db, chosen)
  }
  const siteRows = await db.select({ siteId: runSiteResults.siteId, events: runSiteResults.events, facts: runSiteSnapshots.facts, site: runSiteSnapshots.site }).from(runSiteResults)
    .innerJoin(runSiteSnapshots, and(eq(runSiteSnapshots.runId, runSiteResults.runId), eq(runSiteSnapshots.siteId, runSiteResults.siteId)))
    .where(eq(runSiteResults.runId, runId)).orderBy(asc(runSiteResults.siteId))
  return {
    run: row.run,
    requestedByName: row.requestedByName,
    assumptions: { versionId: row.run.assumptionVersionId, setName: row.setName, version: row.version },
    terms,
    layers,
    sites: siteRows.map((r) => {
      const facts = r.facts
      const events: DecodedEvents = r.events ? decodeEvents(r.events) : { year: new Int32Array(0), loss: new Float64Array(0), tankStart: Int32Array.from([0]), tankIndex: new Int32Array(0), tankLoss: new Float64Array(0), split: null }
      const snapshotTanks = r.site?.tanks
      return {
        siteId: r.siteId, name: facts.name, externalId: facts.externalId, operatorName: facts.operatorName,
        events: { year: events.year, loss: events.loss, propertyDamage: events.split?.propertyDamage ?? null },
        terms: bySite.get(r.siteId) ?? null,
        describe: eventDescriber(events, snapshotTanks),
      }
    }),
  }
}

const compactSummary = (s: YearLossSummary) => ({
  averageAnnualLoss: s.averageAnnualLoss, averageAnnualLossSe: s.averageAnnualLossSe, lossYearShare: s.lossYearShare,
  aggregate: s.aggregate, occurrence: s.occurrence, aggregateCurve: s.aggregateCurve, occurrenceCurve: s.occurrenceCurve,
})

const compactSummaries = (m: PortfolioFinancials['summaries']) => ({ groundUp: compactSummary(m.groundUp), afterTerms: compactSummary(m.afterTerms), insured: compactSummary(m.insured) })

function present(f: PortfolioFinancials, inputs: FinancialInputs) {
  const named = new Map(inputs.sites.map(s => [s.siteId, s]))
  return {
    hasSplit: f.hasSplit,
    portfolio: {
      years: f.years,
      groundUp: compactSummary(f.summaries.groundUp),
      afterTerms: compactSummary(f.summaries.afterTerms),
      insured: compactSummary(f.summaries.insured),
      propertyDamage: compactSummaries(f.splitSummaries.propertyDamage),
      businessInterruption: compactSummaries(f.splitSummaries.businessInterruption),
      premiumSplit: f.premiumSplit,
      insuredStandardDeviation: f.insuredStandardDeviation,
      tailReturnPeriodYears: f.tailReturnPeriodYears,
      insuredLossAtTail: f.insuredLossAtTail,
      insuredTailValueAtRisk: f.insuredTailValueAtRisk,
      premium: f.premium,
    },
    sites: f.sites.map(s => ({ ...s, name: named.get(s.siteId)?.name ?? '', externalId: named.get(s.siteId)?.externalId ?? '', operatorName: named.get(s.siteId)?.operatorName ?? '' })),
    largestEvents: f.largestEvents.map(e => ({ ...e, siteName: named.get(e.siteId)?.name ?? '', ...(named.get(e.siteId)?.describe(e.index) ?? { valueAtRisk: null, tanks: [] }) })),
    layers: f.layers.map(l => ({ ...l, summary: compactSummary(l.summary) })),
  }
}

/** Each site's events with its years shuffled (shared/engine/storm-clusters.ts): same site losses, sites independent. */
function sitesIndependent(sites: FinancialInputs['sites'], years: number, seed: number): FinancialInputs['sites'] {
  return sites.map(s => ({ ...s, events: { ...s.events, year: sitesIndependentYears(s.events.year, years, seed, s.siteId) } }))
}

/** What the comparison shows of the sites-independent portfolio: its curves, tail, layers and premium. */
function accumulationView(f: PortfolioFinancials) {
  return {
    groundUp: compactSummary(f.summaries.groundUp),
    insured: compactSummary(f.summaries.insured),
    insuredLossAtTail: f.insuredLossAtTail,
    insuredTailValueAtRisk: f.insuredTailValueAtRisk,
    premium: f.premium,
    layers: f.layers.map(l => ({ name: l.layer.name, premium: l.premium, summary: compactSummary(l.summary) })),
  }
}

/** Applies the what-if deductibles to one site (or every site) of the inputs. */
function withChangedDeductibles(sites: FinancialInputs['sites'], q: FinancialQuery) {
  return sites.map((s) => {
    if (q.whatIfSiteId && s.siteId !== q.whatIfSiteId) return s
    const base: SiteTerms = s.terms ?? { ...NO_TERMS }
    return { ...s, terms: { ...base, occurrenceDeductible: q.whatIfOccurrenceDeductible ?? base.occurrenceDeductible, aggregateDeductible: q.whatIfAggregateDeductible ?? base.aggregateDeductible } }
  })
}

export function pricingOf(q: FinancialQuery): PricingBasis {
  return { method: q.method, factor: q.factor, returnPeriodYears: q.returnPeriodYears, expenseRatio: q.expenseRatio, profitRatio: q.profitRatio }
}

export function hasWhatIf(q: FinancialQuery) {
  return q.whatIfOccurrenceDeductible !== undefined || q.whatIfAggregateDeductible !== undefined
}

/** The whole view: baseline with the chosen terms, and the what-if when one is asked for. */
export function financialView(inputs: FinancialInputs, q: FinancialQuery) {
  const pricing = pricingOf(q)
  if (q.whatIfSiteId && !inputs.sites.some(s => s.siteId === q.whatIfSiteId)) throw new AppError(400, 'The what-if site is not part of this run.')
  let baseline: PortfolioFinancials
  let changed: PortfolioFinancials | null = null
  let independent: PortfolioFinancials | null = null
  try {
    baseline = computeFinancials(inputs.sites, inputs.run.years, pricing, 50, inputs.layers)
    if (hasWhatIf(q)) changed = computeFinancials(withChangedDeductibles(inputs.sites, q), inputs.run.years, pricing, 50, inputs.layers)
    if (inputs.run.stormClustering) independent = computeFinancials(sitesIndependent(inputs.sites, inputs.run.years, inputs.run.seed), inputs.run.years, pricing, 0, inputs.layers)
  } catch (error) {
    if (error instanceof RangeError) throw new AppError(400, `${error.message[0]!.toUpperCase()}${error.message.slice(1)}.`)
    throw error
  }
  const run = inputs.run
  return {
    run: {
      id: run.id, portfolioId: run.portfolioId, portfolioName: run.portfolioName, years: run.years, seed: run.seed,
      engineVersion: run.engineVersion, inputHash: run.inputHash, finishedAt: run.finishedAt, requestedBy: inputs.requestedByName,
      assumptions: inputs.assumptions,
    },
    terms: inputs.terms,
    sitesWithoutTerms: inputs.sites.filter(s => s.terms === null).length,
    pricing,
    ...present(baseline, inputs),
    /** Storm clustering: the same terms and pricing on the sites' year-loss tables with each site's years shuffled (sites independent). */
    sitesIndependent: independent && accumulationView(independent),
    stormClustering: run.stormClustering,
    whatIf: changed && {
      change: { siteId: q.whatIfSiteId ?? null, occurrenceDeductible: q.whatIfOccurrenceDeductible ?? null, aggregateDeductible: q.whatIfAggregateDeductible ?? null },
      ...present(changed, inputs),
    },
  }
}

export type FinancialView = ReturnType<typeof financialView>
