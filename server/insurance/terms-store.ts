// Terms sets, their versions and per-site rows. A version a run recorded never changes: saving it
// then makes the set's next version, so every run's terms stay exactly as they were.
import { and, asc, desc, eq, isNull, max } from 'drizzle-orm'
import type { SiteTerms } from '../../shared/insurance/terms'
import type { ArchivedFilter } from '../../shared/schemas/archive'
import { archivedFilter } from '../archive/records'
import type { LayerInput, SiteTermsInput } from '../../shared/schemas/insurance'
import type { PortfolioLayer } from '../../shared/insurance/layers'
import { useDb, type Database } from '../db'
import { policyLayers, policySiteTerms, policyTermsSets, policyTermsVersions, portfolios, portfolioSites, runTerms, sites } from '../db/schema'

export async function findTermsSet(organisationId: string, setId: string) {
  const [set] = await useDb().select().from(policyTermsSets).where(and(eq(policyTermsSets.id, setId), eq(policyTermsSets.organisationId, organisationId)))
  return set ?? null
}

export async function findTermsVersion(db: Database, organisationId: string, versionId: string) {
  const [row] = await db.select({ version: policyTermsVersions, set: policyTermsSets }).from(policyTermsVersions)
    .innerJoin(policyTermsSets, eq(policyTermsSets.id, policyTermsVersions.termsSetId))
    .where(and(eq(policyTermsVersions.id, versionId), eq(policyTermsSets.organisationId, organisationId)))
  return row ?? null
}

export async function listTermsVersions(setId: string) {
  return useDb().select().from(policyTermsVersions).where(eq(policyTermsVersions.termsSetId, setId)).orderBy(desc(policyTermsVersions.version))
}

/** The organisation's terms sets with their portfolio's name and newest version number. */
export async function listTermsSets(organisationId: string, archived: ArchivedFilter = 'hide') {
  const rows = await useDb().select({ set: policyTermsSets, portfolioName: portfolios.name, latest: max(policyTermsVersions.version) })
    .from(policyTermsSets)
    .leftJoin(portfolios, eq(portfolios.id, policyTermsSets.portfolioId))
    .leftJoin(policyTermsVersions, eq(policyTermsVersions.termsSetId, policyTermsSets.id))
    .where(and(eq(policyTermsSets.organisationId, organisationId), archivedFilter(policyTermsSets.archivedAt, archived)))
    .groupBy(policyTermsSets.id, portfolios.name)
    .orderBy(asc(policyTermsSets.name))
  return rows.map(r => ({ ...r.set, portfolioName: r.portfolioName, latestVersion: r.latest }))
}

/** Per-site terms of a version, by site id. */
export async function termsBySite(db: Database, versionId: string): Promise<Map<string, SiteTerms>> {
  const rows = await db.select().from(policySiteTerms).where(eq(policySiteTerms.versionId, versionId))
  return new Map(rows.map(r => [r.siteId, { occurrenceDeductible: r.occurrenceDeductible, occurrenceLimit: r.occurrenceLimit, aggregateDeductible: r.aggregateDeductible, aggregateLimit: r.aggregateLimit, interruptionDeductible: r.interruptionDeductible, share: r.share }]))
}

/** The version's layers on the portfolio, in their order. */
export async function layersOf(db: Database, versionId: string): Promise<PortfolioLayer[]> {
  const rows = await db.select().from(policyLayers).where(eq(policyLayers.versionId, versionId)).orderBy(asc(policyLayers.position))
  return rows.map(r => ({ name: r.name, kind: r.kind, attachment: r.attachment, limit: r.limit }))
}

export async function writeLayers(tx: Database, versionId: string, layers: readonly LayerInput[]) {
  await tx.delete(policyLayers).where(eq(policyLayers.versionId, versionId))
  if (layers.length) await tx.insert(policyLayers).values(layers.map((l, position) => ({ versionId, position, ...l })))
}

/** The version's rows beside the portfolio's current sites (a site with no row shows empty terms). */
export async function versionRowsWithSites(versionId: string, portfolioId: string) {
  const db = useDb()
  const terms = await termsBySite(db, versionId)
  const current = await db.select({ id: sites.id, name: sites.name, externalId: sites.externalId, operatorName: sites.operatorName }).from(portfolioSites)
    .innerJoin(sites, eq(sites.id, portfolioSites.siteId)).where(eq(portfolioSites.portfolioId, portfolioId)).orderBy(asc(sites.name))
  const currentIds = new Set(current.map(s => s.id))
  const gone = [...terms.keys()].filter(id => !currentIds.has(id))
  return {
    sites: current.map(s => ({ ...s, terms: terms.get(s.id) ?? null })),
    /** Rows for sites no longer in the portfolio (kept with the version). */
    formerSites: gone.map(id => ({ siteId: id, terms: terms.get(id)! })),
  }
}

/** The site ids of a portfolio, to check that terms rows name its sites. */
export async function portfolioSiteIds(db: Database, portfolioId: string): Promise<Set<string>> {
  const rows = await db.select({ id: portfolioSites.siteId }).from(portfolioSites).where(eq(portfolioSites.portfolioId, portfolioId))
  return new Set(rows.map(r => r.id))
}

export async function writeTermsRows(tx: Database, versionId: string, rows: readonly SiteTermsInput[]) {
  await tx.delete(policySiteTerms).where(eq(policySiteTerms.versionId, versionId))
  for (let i = 0; i < rows.length; i += 1000) {
    await tx.insert(policySiteTerms).values(rows.slice(i, i + 1000).map(r => ({ versionId, ...r })))
  }
}

/** Adds the set's next version holding `rows`. */
export async function addTermsVersion(tx: Database, setId: string, userId: string | null, note: string, rows: readonly SiteTermsInput[], layers: readonly LayerInput[] = []) {
  const [{ latest } = { latest: 0 }] = await tx.select({ latest: max(policyTermsVersions.version) }).from(policyTermsVersions).where(eq(policyTermsVersions.termsSetId, setId))
  const [version] = await tx.insert(policyTermsVersions).values({ termsSetId: setId, version: (latest ?? 0) + 1, note, createdBy: userId }).returning()
  await writeTermsRows(tx, version!.id, rows)
  await writeLayers(tx, version!.id, layers)
  return version!
}

/**
 * At a run's start: records the newest terms version of the portfolio (for the run's organisation)
 * and freezes it. Nothing is recorded when the portfolio has no terms.
 */
export async function recordRunTerms(tx: Database, runId: string, organisationId: string, portfolioId: string): Promise<string | null> {
  const [latest] = await tx.select({ id: policyTermsVersions.id }).from(policyTermsVersions)
    .innerJoin(policyTermsSets, eq(policyTermsSets.id, policyTermsVersions.termsSetId))
    // Archived terms are kept for the runs that used them, and new runs no longer record them.
    .where(and(eq(policyTermsSets.organisationId, organisationId), eq(policyTermsSets.portfolioId, portfolioId), isNull(policyTermsSets.archivedAt)))
    .orderBy(desc(policyTermsVersions.version)).limit(1).for('update')
  if (!latest) return null
  await tx.insert(runTerms).values({ runId, termsVersionId: latest.id })
  await tx.update(policyTermsVersions).set({ usedByRun: true }).where(eq(policyTermsVersions.id, latest.id))
  return latest.id
}

export async function runTermsVersionId(db: Database, runId: string): Promise<string | null> {
  const [row] = await db.select().from(runTerms).where(eq(runTerms.runId, runId))
  return row?.termsVersionId ?? null
}
