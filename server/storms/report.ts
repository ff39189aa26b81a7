// Reading storm reports. A window belongs to the organisation whose flashes made it; its members
// see every tank, and an organisation that a portfolio was shared with sees the tanks of the
// shared sites only. Insured loss is the reader's: its own current terms on each site, applied to
// the site's stored loss model as one occurrence per site and window (shared/storms/loss.ts); a
// site without the reader's terms says "no terms", never 0.
import { and, asc, desc, eq, inArray, isNull, or, sql } from 'drizzle-orm'
import type { StormReportSite, StormReportView } from '../../shared/storms/types'
import { stormSiteLoss, type StormSiteLossModel } from '../../shared/storms/loss'
import { NO_TERMS, type SiteTerms } from '../../shared/insurance/terms'
import { useDb, type Database } from '../db'
import {
  assumptionSets, assumptionSetVersions, policyTermsSets, policyTermsVersions, portfolioSites, sites, stormFlashes, stormSiteResults, stormTankResults,
  stormWindows, tanks,
} from '../db/schema'
import { termsBySite } from '../insurance/terms-store'
import { sharedSiteIds } from '../inventory/access'
import type { Member } from '../utils/auth'
import { notFound } from '../utils/errors'

/** Organisations whose storm windows the member's organisation may read (itself, and those sharing a portfolio with it). */
function readableWindowFilter(organisationId: string) {
  return or(
    eq(stormWindows.organisationId, organisationId),
    inArray(stormWindows.id, useDb().selectDistinct({ id: stormTankResults.windowId }).from(stormTankResults).where(inArray(stormTankResults.siteId, sharedSiteIds(organisationId)))),
  )!
}

/** Sites of portfolios shared with the organisation, as SQL for a sub-select. */
function sharedSitesSql(organisationId: string) {
  return sql`select ps.site_id from portfolio_sites ps join portfolio_shares sh on sh.portfolio_id = ps.portfolio_id where sh.organisation_id = ${organisationId}`
}

export async function listStormWindows(member: Member) {
  return useDb().select({
    id: stormWindows.id, startsAt: stormWindows.startsAt, endsAt: stormWindows.endsAt, flashCount: stormWindows.flashCount, state: stormWindows.state,
    computedAt: stormWindows.computedAt, own: sql<boolean>`${stormWindows.organisationId} = ${member.organisationId}`,
    // Another organisation's storm: its figures over the shared sites only, never the owner's totals.
    // Correlated sub-selects name the outer table in full (Drizzle would render its columns unqualified).
    expectedFires: sql<number>`case when storm_windows.organisation_id = ${member.organisationId} then storm_windows.expected_fires
      else (select coalesce(sum(r.ignition), 0) from storm_tank_results r where r.window_id = storm_windows.id and r.site_id in (${sharedSitesSql(member.organisationId)})) end`,
    topIgnition: sql<number | null>`(select max(r.ignition) from storm_tank_results r where r.window_id = storm_windows.id
      and (storm_windows.organisation_id = ${member.organisationId} or r.site_id in (${sharedSitesSql(member.organisationId)})))`,
  }).from(stormWindows).where(readableWindowFilter(member.organisationId)).orderBy(desc(stormWindows.startsAt)).limit(500)
}

/** The reader's current terms per site: its newest version of each terms set in use whose portfolio holds the site. */
async function currentTerms(db: Database, organisationId: string, siteIds: string[]): Promise<Map<string, SiteTerms>> {
  const out = new Map<string, SiteTerms>()
  if (siteIds.length === 0) return out
  const sets = await db.select({ id: policyTermsSets.id, portfolioId: policyTermsSets.portfolioId }).from(policyTermsSets)
    .where(and(eq(policyTermsSets.organisationId, organisationId), isNull(policyTermsSets.archivedAt))).orderBy(desc(policyTermsSets.updatedAt))
  for (const set of sets) {
    const [version] = await db.select({ id: policyTermsVersions.id }).from(policyTermsVersions).where(eq(policyTermsVersions.termsSetId, set.id)).orderBy(desc(policyTermsVersions.version)).limit(1)
    if (!version) continue
    const inPortfolio = new Set((await db.select({ siteId: portfolioSites.siteId }).from(portfolioSites).where(eq(portfolioSites.portfolioId, set.portfolioId))).map(r => r.siteId))
    const terms = await termsBySite(db, version.id)
    for (const siteId of siteIds) {
      if (out.has(siteId) || !inPortfolio.has(siteId)) continue
      out.set(siteId, terms.get(siteId) ?? NO_TERMS)
    }
  }
  return out
}

export async function stormReport(member: Member, windowId: string): Promise<StormReportView> {
  const db = useDb()
  const [window] = await db.select().from(stormWindows).where(and(eq(stormWindows.id, windowId), readableWindowFilter(member.organisationId)))
  if (!window) notFound('Storm window')
  const own = window.organisationId === member.organisationId
  const shared = own ? null : new Set((await sharedSiteIds(member.organisationId)).map(r => r.siteId))
  const rows = await db.select({
    tankId: stormTankResults.tankId, siteId: stormTankResults.siteId, direct: stormTankResults.direct, sparking: stormTankResults.sparking,
    ignition: stormTankResults.ignition, drivingFlashId: stormTankResults.drivingFlashId, drivingIgnition: stormTankResults.drivingIgnition,
    fireLossPropertyDamage: stormTankResults.fireLossPropertyDamage, fireLossInterruption: stormTankResults.fireLossInterruption,
    tag: tanks.tag, siteName: sites.name, siteExternalId: sites.externalId, latDeg: sites.latitudeDeg, lonDeg: sites.longitudeDeg,
    flashTime: stormFlashes.occurredAt, flashCurrentKa: stormFlashes.peakCurrentKa, flashLat: stormFlashes.latDeg, flashLon: stormFlashes.lonDeg, flashErrorKm: stormFlashes.locationErrorKm,
  }).from(stormTankResults)
    .innerJoin(tanks, eq(tanks.id, stormTankResults.tankId)).innerJoin(sites, eq(sites.id, stormTankResults.siteId))
    .leftJoin(stormFlashes, eq(stormFlashes.id, stormTankResults.drivingFlashId))
    .where(eq(stormTankResults.windowId, windowId)).orderBy(desc(stormTankResults.ignition), asc(sites.name), asc(tanks.tag))
  const visible = shared ? rows.filter(r => shared.has(r.siteId)) : rows
  const modelRows = (await db.select({ siteId: stormSiteResults.siteId, lossModel: stormSiteResults.lossModel, siteName: sites.name, siteExternalId: sites.externalId })
    .from(stormSiteResults).innerJoin(sites, eq(sites.id, stormSiteResults.siteId)).where(eq(stormSiteResults.windowId, windowId)).orderBy(asc(sites.name)))
    .filter(r => !shared || shared.has(r.siteId))
  const terms = await currentTerms(db, member.organisationId, [...new Set([...visible.map(r => r.siteId), ...modelRows.map(r => r.siteId)])])
  const { siteLosses, burning } = siteLossesOf(`${windowId}|${window.computedAt?.toISOString() ?? ''}`, windowId, modelRows.map(r => ({ ...r, lossModel: r.lossModel as StormSiteLossModel })), visible, terms)
  let expectedFires = 0
  const tankRows = visible.map((r) => {
    expectedFires += r.ignition
    const b = burning.get(r.tankId)
    const { fireLossPropertyDamage, fireLossInterruption, ...rest } = r
    return {
      ...rest, flashTime: r.flashTime?.toISOString() ?? null,
      // A window computed before site losses were kept: its stored figure (P(fire) × the loss of a fire starting there).
      burning: b?.burning ?? r.ignition,
      expectedGroundUpLoss: b ? b.burning * b.expectedLossIfBurning : r.ignition * (fireLossPropertyDamage + fireLossInterruption),
    }
  })
  let groundUp = 0, insured = 0, insuredVar = 0
  for (const s of siteLosses) {
    groundUp += s.expectedGroundUpLoss
    if (s.expectedInsuredLoss !== null) { insured += s.expectedInsuredLoss; insuredVar += (s.insuredSe ?? 0) ** 2 }
  }
  const siteIds = [...new Set(visible.map(r => r.siteId))]
  const siteRows = own
    ? await db.select({ id: sites.id, name: sites.name, latDeg: sites.latitudeDeg, lonDeg: sites.longitudeDeg }).from(sites).where(eq(sites.organisationId, window.organisationId))
    : siteIds.length ? await db.select({ id: sites.id, name: sites.name, latDeg: sites.latitudeDeg, lonDeg: sites.longitudeDeg }).from(sites).where(inArray(sites.id, siteIds)) : []
  const flashes = await db.select({ id: stormFlashes.id, time: stormFlashes.occurredAt, latDeg: stormFlashes.latDeg, lonDeg: stormFlashes.lonDeg, peakCurrentKa: stormFlashes.peakCurrentKa, type: stormFlashes.type, locationErrorKm: stormFlashes.locationErrorKm })
    .from(stormFlashes).where(eq(stormFlashes.windowId, windowId)).orderBy(asc(stormFlashes.occurredAt)).limit(20_000)
  const [assumption] = window.assumptionVersionId
    ? await db.select({ setName: assumptionSets.name, version: assumptionSetVersions.version }).from(assumptionSetVersions)
      .innerJoin(assumptionSets, eq(assumptionSets.id, assumptionSetVersions.assumptionSetId)).where(eq(assumptionSetVersions.id, window.assumptionVersionId))
    : [undefined]
  return {
    window: {
      id: window.id, startsAt: window.startsAt.toISOString(), endsAt: window.endsAt.toISOString(), flashCount: window.flashCount, state: window.state,
      computedAt: window.computedAt?.toISOString() ?? null, engineVersion: window.engineVersion, summary: window.summary, own,
      assumptions: assumption ? `${assumption.setName} — version ${assumption.version}` : 'documented defaults (the organisation has no assumption set)',
    },
    totals: {
      expectedFires, expectedGroundUpLoss: groundUp, expectedInsuredLoss: insured, insuredSe: Math.sqrt(insuredVar),
      sites: siteLosses.length, sitesWithTerms: siteLosses.filter(x => x.terms === 'current').length,
      sitesWithoutTerms: siteLosses.filter(x => x.terms === 'none').length, sitesNotComputed: siteLosses.filter(x => x.terms === 'not computed').length,
    },
    currency: member.currency,
    tanks: tankRows,
    siteLosses,
    sites: siteRows,
    flashes: flashes.map(f => ({ ...f, time: f.time.toISOString() })),
  }
}

// A site's figure depends only on its stored model (fixed while the window's computedAt is) and the
// terms; a report read again, or by many readers, reuses it (the exact and Monte Carlo figures take
// tens of milliseconds a site).
const siteLossCache = new Map<string, ReturnType<typeof stormSiteLoss>>()
function cachedSiteLoss(key: string, compute: () => ReturnType<typeof stormSiteLoss>) {
  let hit = siteLossCache.get(key)
  if (!hit) {
    hit = compute()
    if (siteLossCache.size >= 5000) siteLossCache.clear()
    siteLossCache.set(key, hit)
  }
  return hit
}

type TankRow = { tankId: string, siteId: string, siteName: string, siteExternalId: string, ignition: number, fireLossPropertyDamage: number, fireLossInterruption: number }

/**
 * Per site the window reached: one occurrence through the reader's terms (shared/storms/loss.ts),
 * or "no terms"; a window computed before site losses were stored gives its stored ground-up figure
 * and no insured figure. Also each tank's P(burns) and expected loss if it burns.
 */
export function siteLossesOf(cacheKey: string, windowId: string, models: { siteId: string, siteName: string, siteExternalId: string, lossModel: StormSiteLossModel }[], tankRows: readonly TankRow[], terms: Map<string, SiteTerms>) {
  const burning = new Map<string, { burning: number, expectedLossIfBurning: number }>()
  // A site whose model holds no tank that can burn is computed (nothing to lose) and not listed.
  const siteLosses: StormReportSite[] = models.filter(m => m.lossModel.tanks.length > 0).map((m) => {
    const siteTerms = terms.get(m.siteId) ?? null
    const loss = cachedSiteLoss(`${cacheKey}|${m.siteId}|${JSON.stringify(siteTerms)}`, () => stormSiteLoss(m.lossModel, siteTerms, { window: windowId, site: m.siteId }))
    for (const t of loss.tanks) burning.set(t.tankId, t)
    return {
      siteId: m.siteId, siteName: m.siteName, siteExternalId: m.siteExternalId, probabilityOfFire: loss.probabilityOfFire,
      expectedGroundUpLoss: loss.groundUp.total, valueAtRisk: m.lossModel.valueAtRisk, terms: siteTerms ? 'current' : 'none',
      expectedInsuredLoss: loss.insured?.mean ?? null, insuredSe: loss.insured?.se ?? null, method: loss.insured?.method ?? null,
      samples: loss.insured?.samples ?? null, insuredAtRisk: loss.insuredAtRisk,
    }
  })
  const modelled = new Set(models.map(m => m.siteId))
  const legacy = new Map<string, StormReportSite>()
  for (const r of tankRows) {
    if (modelled.has(r.siteId)) continue
    let site = legacy.get(r.siteId)
    if (!site) {
      site = { siteId: r.siteId, siteName: r.siteName, siteExternalId: r.siteExternalId, probabilityOfFire: null, expectedGroundUpLoss: 0, valueAtRisk: null, terms: 'not computed', expectedInsuredLoss: null, insuredSe: null, method: null, samples: null, insuredAtRisk: null }
      legacy.set(r.siteId, site)
    }
    site.expectedGroundUpLoss += r.ignition * (r.fireLossPropertyDamage + r.fireLossInterruption)
  }
  siteLosses.push(...legacy.values())
  siteLosses.sort((a, b) => b.expectedGroundUpLoss - a.expectedGroundUpLoss || a.siteName.localeCompare(b.siteName))
  return { siteLosses, burning }
}

export type StormReport = StormReportView
