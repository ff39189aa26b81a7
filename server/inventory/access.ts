// Who may see and change which inventory rows. An organisation reads and writes its own portfolios,
// sites, tanks and structures; it reads (never writes) those of a portfolio shared with it.
// Another organisation's rows answer 404; a write to a row shared read-only answers 403.
import { and, eq, inArray, or, type SQL } from 'drizzle-orm'
import { useDb } from '../db'
import { portfolioShares, portfolioSites, siteStructures, sites, tanks } from '../db/schema'
import type { Member } from '../utils/auth'
import { conflict, forbidden, notFound } from '../utils/errors'
import { readablePortfolio } from './portfolio-access'

const READ_ONLY = 'This inventory is shared with your organisation read-only; it can only be changed by the organisation that owns it.'

/** Ids of the sites in portfolios shared with the organisation. */
export function sharedSiteIds(organisationId: string) {
  return useDb().select({ siteId: portfolioSites.siteId }).from(portfolioSites)
    .innerJoin(portfolioShares, eq(portfolioShares.portfolioId, portfolioSites.portfolioId))
    .where(eq(portfolioShares.organisationId, organisationId))
}

export function readableSites(organisationId: string): SQL {
  return or(eq(sites.organisationId, organisationId), inArray(sites.id, sharedSiteIds(organisationId)))!
}

export async function findReadableSite(member: Member, id: string) {
  const [site] = await useDb().select().from(sites).where(and(eq(sites.id, id), readableSites(member.organisationId)))
  if (!site) notFound('Site')
  return { site, readOnly: site.organisationId !== member.organisationId }
}

export async function findEditableSite(member: Member, id: string) {
  const { site, readOnly } = await findReadableSite(member, id)
  if (readOnly) forbidden(READ_ONLY)
  return site
}

export async function findReadableTank(member: Member, id: string) {
  const [row] = await useDb().select({ tank: tanks, site: sites }).from(tanks).innerJoin(sites, eq(sites.id, tanks.siteId))
    .where(and(eq(tanks.id, id), readableSites(member.organisationId)))
  if (!row) notFound('Tank')
  return { ...row, readOnly: row.site.organisationId !== member.organisationId }
}

export async function findEditableTank(member: Member, id: string) {
  const row = await findReadableTank(member, id)
  if (row.readOnly) forbidden(READ_ONLY)
  return row
}

export async function findEditableStructure(member: Member, id: string) {
  const [row] = await useDb().select({ structure: siteStructures, site: sites }).from(siteStructures).innerJoin(sites, eq(sites.id, siteStructures.siteId))
    .where(and(eq(siteStructures.id, id), readableSites(member.organisationId)))
  if (!row) notFound('Structure')
  if (row.site.organisationId !== member.organisationId) forbidden(READ_ONLY)
  return row
}

/** The portfolio if the member's organisation may read it (server/inventory/portfolio-access.ts); 404 otherwise. */
export async function findReadablePortfolio(member: Member, id: string) {
  const row = await readablePortfolio(member.organisationId, id)
  if (!row) notFound('Portfolio')
  return row
}

export async function findEditablePortfolio(member: Member, id: string) {
  const row = await findReadablePortfolio(member, id)
  if (row.readOnly) forbidden(READ_ONLY)
  return row.portfolio
}

/** Postgres unique violations → 409 with a message about the field that clashed. */
export function rethrowUnique(error: unknown, messages: Record<string, string>): never {
  const e = error as { code?: string, constraint?: string, cause?: { code?: string, constraint?: string } }
  const code = e.code ?? e.cause?.code
  const constraint = e.constraint ?? e.cause?.constraint
  if (code === '23505' && constraint && messages[constraint]) conflict(messages[constraint])
  throw error
}

export const SITE_UNIQUE = { sites_org_external_id_unique: 'Another site of your organisation already has this reference.' }
export const TANK_UNIQUE = {
  tanks_site_external_id_unique: 'Another tank on this site already has this reference.',
  tanks_site_tag_unique: 'Another tank on this site already has this tag.',
}
export const STRUCTURE_UNIQUE = { site_structures_site_external_id_unique: 'Another structure on this site already has this reference.' }
export const PORTFOLIO_UNIQUE = { portfolios_org_name_unique: 'Your organisation already has a portfolio with this name.' }

