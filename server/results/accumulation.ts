// The accumulation view of a succeeded run (shared/results/accumulation.ts): read every site's packed
// loss events once, find the portfolio's worst years and the sites that lose together in them.
// Kept as serialised JSON per run, currency and query (server/results/cache.ts): a run's results never change.
import { and, asc, eq } from 'drizzle-orm'
import { accumulation } from '../../shared/results/accumulation'
import type { AccumulationQuery } from '../../shared/schemas/accumulation'
import { useDb } from '../db'
import { runSiteResults, runSiteSnapshots } from '../db/schema'
import { decodeEvents } from '../runs/events-codec'
import type { RunRow } from './queries'

export interface AccumulationSiteRow {
  siteId: string, name: string, externalId: string, latitude: number, longitude: number, insuredValue: number
  worstYearsLoss: number, share: number, lossYears: number, lossYearShare: number, group: number | null
}

export async function runAccumulation(run: RunRow, currency: string, query: AccumulationQuery) {
  const base = {
    run: { id: run.id, mode: run.mode, years: run.years, portfolioName: run.portfolioName, portfolioId: run.portfolioId, finishedAt: run.finishedAt, engineVersion: run.engineVersion },
    currency,
    returnPeriodYears: query.returnPeriodYears,
    minShareTogether: query.minShareTogether,
  }
  // A frequency run keeps no simulated years: the page says so.
  if (run.mode !== 'year') return { ...base, available: false as const, worstYears: [], thresholdLoss: 0, worstYearsLoss: 0, sites: [] as AccumulationSiteRow[], groups: [] }
  const rows = await useDb().select({ siteId: runSiteResults.siteId, events: runSiteResults.events, facts: runSiteSnapshots.facts }).from(runSiteResults)
    .innerJoin(runSiteSnapshots, and(eq(runSiteSnapshots.runId, runSiteResults.runId), eq(runSiteSnapshots.siteId, runSiteResults.siteId)))
    .where(eq(runSiteResults.runId, run.id)).orderBy(asc(runSiteResults.siteId))
  const events = rows.map((r) => {
    const e = r.events ? decodeEvents(r.events) : null
    return { siteId: r.siteId, year: e?.year ?? new Int32Array(0), loss: e?.loss ?? new Float64Array(0) }
  })
  const a = accumulation(run.years, events, query)
  const facts = new Map(rows.map(r => [r.siteId, r.facts]))
  const sites: AccumulationSiteRow[] = a.sites.map((s) => {
    const f = facts.get(s.siteId)!
    return { ...s, name: f.name, externalId: f.externalId, latitude: f.latitudeDeg, longitude: f.longitudeDeg, insuredValue: f.insuredValue }
  })
  return {
    ...base,
    available: true as const,
    worstYears: a.worstYears,
    thresholdLoss: a.thresholdLoss,
    worstYearsLoss: a.worstYearsLoss,
    sites: sites.sort((x, y) => y.worstYearsLoss - x.worstYearsLoss || (x.name < y.name ? -1 : 1)),
    groups: a.groups.map((g, i) => ({ number: i + 1, ...g, names: g.siteIds.map(id => facts.get(id)?.name ?? '') })),
  }
}
export type AccumulationView = Awaited<ReturnType<typeof runAccumulation>>
