// Read models of the inventory screens: the site list (server-side sort, filter, pages) and a site with
// its tanks, components and structures. The caller has already scoped what the member may read.
import { and, asc, desc, eq, ilike, inArray, or, sql, type SQL } from 'drizzle-orm'
import type { Database } from '../db'
import { organisations, portfolioSites, portfolios, siteStructures, sites, tankComponents, tanks } from '../db/schema'
import type { SiteListQuery } from '../../shared/schemas/inventory'
import { pageWindow } from '../db/pagination'

// Written out in full: Drizzle leaves columns unqualified in a single-table select, which would bind to the inner table.
const tankCount = sql<number>`(SELECT count(*)::int FROM tanks t WHERE t.site_id = "sites"."id")`
const structureCount = sql<number>`(SELECT count(*)::int FROM site_structures st WHERE st.site_id = "sites"."id")`

const SORT_COLUMNS = {
  name: sites.name,
  externalId: sites.externalId,
  operatorName: sites.operatorName,
  flashDensity: sql`coalesce(${sites.flashDensityPerKm2Yr}, 0.04 * power(${sites.thunderstormDaysPerYr}, 1.25))`,
  tankCount,
  updatedAt: sites.updatedAt,
} as const

/** One page of the sites the member may read, with tank and structure counts. */
export async function listSites(db: Database, organisationId: string, readable: SQL, query: SiteListQuery) {
  const filters: SQL[] = [readable]
  if (query.q) {
    const like = `%${query.q.replace(/[\\%_]/g, c => `\\${c}`)}%`
    filters.push(or(ilike(sites.name, like), ilike(sites.externalId, like))!)
  }
  if (query.operator) filters.push(eq(sites.operatorName, query.operator))
  if (query.portfolioId) filters.push(inArray(sites.id, db.select({ id: portfolioSites.siteId }).from(portfolioSites).where(eq(portfolioSites.portfolioId, query.portfolioId))))
  const where = and(...filters)
  const window = pageWindow(query)
  const order = query.dir === 'desc' ? desc(SORT_COLUMNS[query.sort]) : asc(SORT_COLUMNS[query.sort])
  const [items, totals, operators] = await Promise.all([
    db.select({
      id: sites.id, externalId: sites.externalId, name: sites.name, operatorName: sites.operatorName,
      latitudeDeg: sites.latitudeDeg, longitudeDeg: sites.longitudeDeg,
      flashDensityPerKm2Yr: sites.flashDensityPerKm2Yr, thunderstormDaysPerYr: sites.thunderstormDaysPerYr,
      tankCount, structureCount, organisationId: sites.organisationId, updatedAt: sites.updatedAt,
    }).from(sites).where(where).orderBy(order, asc(sites.id)).limit(window.limit).offset(window.offset),
    db.select({ total: sql<number>`count(*)::int` }).from(sites).where(where) as Promise<{ total: number }[]>,
    db.selectDistinct({ operatorName: sites.operatorName }).from(sites).where(readable).orderBy(asc(sites.operatorName)),
  ])
  return {
    items: items.map(({ organisationId: owner, ...s }) => ({ ...s, readOnly: owner !== organisationId })),
    total: totals[0]?.total ?? 0,
    page: query.page,
    pageSize: query.pageSize,
    operators: operators.map(o => o.operatorName).filter(Boolean),
  }
}

/** Tanks of some sites with their components, ordered by tag. */
export async function tanksWithComponents(db: Database, siteIds: string[]) {
  if (siteIds.length === 0) return []
  const rows = await db.select().from(tanks).where(inArray(tanks.siteId, siteIds)).orderBy(asc(tanks.tag))
  const comps = rows.length === 0 ? [] : await db.select().from(tankComponents).where(inArray(tankComponents.tankId, rows.map(r => r.id))).orderBy(asc(tankComponents.componentClass))
  return rows.map(t => ({ ...t, components: comps.filter(c => c.tankId === t.id).map(c => ({ componentClass: c.componentClass, count: c.count, heightM: c.heightM })) }))
}

/** A site with everything drawn on its page. */
export async function siteDetail(db: Database, siteId: string, organisationId: string) {
  const [site] = await db.select({ site: sites, ownerName: organisations.name }).from(sites).innerJoin(organisations, eq(organisations.id, sites.organisationId)).where(eq(sites.id, siteId))
  if (!site) return null
  const [tankRows, structures, inPortfolios] = await Promise.all([
    tanksWithComponents(db, [siteId]),
    db.select().from(siteStructures).where(eq(siteStructures.siteId, siteId)).orderBy(asc(siteStructures.externalId)),
    db.select({ id: portfolios.id, name: portfolios.name }).from(portfolioSites).innerJoin(portfolios, eq(portfolios.id, portfolioSites.portfolioId))
      .where(and(eq(portfolioSites.siteId, siteId), eq(portfolios.organisationId, organisationId))).orderBy(asc(portfolios.name)),
  ])
  return { ...site.site, ownerName: site.ownerName, readOnly: site.site.organisationId !== organisationId, tanks: tankRows, structures, portfolios: inPortfolios }
}
