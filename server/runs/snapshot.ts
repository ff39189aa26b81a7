// The inventory a run covers, frozen at start: every site of the portfolio as engine input plus the
// facts people read (names, coordinates, insured values), and a hash of everything that decides
// the results.
import { createHash } from 'node:crypto'
import { asc, eq, inArray } from 'drizzle-orm'
import type { AssumptionSet } from '../../shared/engine/assumptions'
import { flashDensityFromThunderstormDays } from '../../shared/engine/flash-density'
import type { SiteInput } from '../../shared/engine/types'
import type { ClusteringFrame } from '../../shared/engine/storm-clusters'
import type { Database } from '../db'
import { portfolioSites, sites, siteStructures, tankComponents, tanks } from '../db/schema'

export interface SiteFacts {
  name: string
  externalId: string
  operatorName: string
  latitudeDeg: number
  longitudeDeg: number
  flashDensitySource: 'entered' | 'thunderstorm_days'
  thunderstormDaysPerYr: number | null
  insuredValue: number
}

export interface SnapshotSite { site: SiteInput, facts: SiteFacts }

export async function loadPortfolioSites(db: Database, portfolioId: string, assumptions: AssumptionSet): Promise<SnapshotSite[]> {
  const siteRows = await db.select({ site: sites }).from(portfolioSites)
    .innerJoin(sites, eq(sites.id, portfolioSites.siteId))
    .where(eq(portfolioSites.portfolioId, portfolioId))
    .orderBy(asc(sites.id))
  return snapshotSites(db, siteRows.map(r => r.site), assumptions)
}

/** The given inventory sites as engine input with their facts (also used by capital planning). */
export async function snapshotSites(db: Database, siteList: Array<typeof sites.$inferSelect>, assumptions: AssumptionSet): Promise<SnapshotSite[]> {
  const siteRows = siteList.map(site => ({ site }))
  if (siteRows.length === 0) return []
  const siteIds = siteRows.map(r => r.site.id)
  const tankRows = await db.select().from(tanks).where(inArray(tanks.siteId, siteIds)).orderBy(asc(tanks.siteId), asc(tanks.tag))
  const tankIds = tankRows.map(t => t.id)
  const componentRows = tankIds.length ? await db.select().from(tankComponents).where(inArray(tankComponents.tankId, tankIds)).orderBy(asc(tankComponents.componentClass)) : []
  const structureRows = await db.select().from(siteStructures).where(inArray(siteStructures.siteId, siteIds)).orderBy(asc(siteStructures.externalId))

  const componentsByTank = groupBy(componentRows, c => c.tankId)
  const tanksBySite = groupBy(tankRows, t => t.siteId)
  const structuresBySite = groupBy(structureRows, s => s.siteId)

  return siteRows.map(({ site }) => {
    const ng = site.flashDensityPerKm2Yr ?? flashDensityFromThunderstormDays(site.thunderstormDaysPerYr!, assumptions.flashDensityFormula)
    const siteTanks = tanksBySite.get(site.id) ?? []
    const input: SiteInput = {
      id: site.id,
      name: site.name,
      flashDensity: ng,
      tanks: siteTanks.map(t => ({
        id: t.id, tag: t.tag, xM: t.xM, yM: t.yM, heightM: t.heightM, diameterM: t.diameterM,
        material: t.material, contents: t.contents, flammableVapourSpace: t.flammableVapourSpace,
        chemicalFlashPointC: t.chemicalFlashPointC,
        components: (componentsByTank.get(t.id) ?? []).map(c => ({ componentClass: c.componentClass, count: c.count, heightM: c.heightM })),
        shieldRatingKa: t.shieldRatingKa, vapourControl: t.vapourControl,
        replacementValue: t.replacementValue, contentsValue: t.contentsValue, cleanupCost: t.cleanupCost, interruptionCost: t.interruptionCost,
      })),
      structures: (structuresBySite.get(site.id) ?? []).map(s => ({ id: s.id, kind: s.kind, xM: s.xM, yM: s.yM, heightM: s.heightM, radiusM: s.radiusM })),
    }
    const facts: SiteFacts = {
      name: site.name, externalId: site.externalId, operatorName: site.operatorName,
      latitudeDeg: site.latitudeDeg, longitudeDeg: site.longitudeDeg,
      flashDensitySource: site.flashDensityPerKm2Yr !== null ? 'entered' : 'thunderstorm_days',
      thunderstormDaysPerYr: site.thunderstormDaysPerYr,
      insuredValue: (site.insuredPropertyValue ?? 0) + (site.insuredInterruptionValue ?? 0),
    }
    return { site: input, facts }
  })
}

function groupBy<T>(rows: T[], key: (row: T) => string): Map<string, T[]> {
  const map = new Map<string, T[]>()
  for (const row of rows) {
    const k = key(row)
    const list = map.get(k)
    if (list) list.push(row)
    else map.set(k, [row])
  }
  return map
}

/** JSON with object keys sorted, so equal inputs always hash alike. */
export function canonicalJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`
  if (value && typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>).filter(([, v]) => v !== undefined).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`
  }
  return JSON.stringify(value)
}

export interface HashInputs {
  engineVersion: string
  /** The set's deciding parts (decidingAssumptions). */
  assumptions: Partial<AssumptionSet>
  mode: string
  seed: number
  targetRse: number
  maxSamplesPerTank: number
  /** Absent for runs hashed before the rule was an option (they used the default, 1e-5 /yr). */
  negligibleRatePerYear?: number
  years: number
  /** Storm clustering's frame; absent when off (so runs hashed before the option keep their hash). */
  stormClustering?: ClusteringFrame
  /** Assumption draws; absent when off, so runs without draws keep their hash. */
  assumptionDraws?: number
  sites: SiteInput[]
}

/**
 * The assumption set as it decides a run's results: the uncertainty matters only to a run with
 * assumption draws, the storm clustering parameters only to a run with clustering on; a run without
 * them hashes the same whatever they hold.
 */
export function decidingAssumptions(assumptions: AssumptionSet, options: { assumptionDraws: number, stormClustering: boolean }): Partial<AssumptionSet> {
  const { uncertainty, stormClustering, ...rest } = assumptions
  return {
    ...rest,
    ...(options.assumptionDraws > 0 ? { uncertainty } : {}),
    ...(options.stormClustering ? { stormClustering } : {}),
  }
}

/** sha-256 of everything that decides a run's results (chunk size and worker count do not). */
export function inputHash(inputs: HashInputs): string {
  return createHash('sha256').update(canonicalJson(inputs)).digest('hex')
}
