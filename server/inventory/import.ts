// Third and fourth steps of an import: compare the validated rows with the organisation's inventory
// (matched by external id) → new / changed / unchanged and the cross-row errors; then write the new
// and changed rows in the caller's transaction. Nothing here commits on its own.
import { eq, getTableColumns, inArray, sql, type SQL } from 'drizzle-orm'
import type { PgTable } from 'drizzle-orm/pg-core'
import type { Database } from '../db'
import { portfolioSites, siteStructures, sites, tankComponents, tanks } from '../db/schema'
import type { SiteRecord, StructureRecord, TankRecord } from '../../shared/schemas/inventory'
import type { RowError, SiteRow, StructureRow, TankRow, ValidatedFile } from './rows'
import { csvFormatInWords } from './workbook'

export type RowStatus = 'new' | 'changed' | 'unchanged'
export interface Counts { new: number, changed: number, unchanged: number }
export interface ImportSummary {
  rows: number, sheets: string[], sites: Counts, tanks: Counts, structures: Counts, errors: number
  /** How a CSV file was read, in words ("CSV, semicolon-separated, decimal commas, Windows-1252 text"); absent for workbooks. */
  readAs?: string
}

export interface ImportPlan {
  summary: ImportSummary
  errors: RowError[]
  sites: (SiteRow & { status: RowStatus })[]
  tanks: (TankRow & { status: RowStatus })[]
  structures: (StructureRow & { status: RowStatus })[]
  siteIdByExternal: Map<string, string>
}

const SITE_FIELDS = ['externalId', 'name', 'operatorName', 'latitudeDeg', 'longitudeDeg', 'flashDensityPerKm2Yr', 'thunderstormDaysPerYr', 'locationNotes', 'insuredPropertyValue', 'insuredInterruptionValue'] as const
const TANK_FIELDS = ['externalId', 'tag', 'material', 'heightM', 'diameterM', 'xM', 'yM', 'contents', 'flammableVapourSpace', 'chemicalFlashPointC', 'grounding', 'shieldRatingKa', 'vapourControl', 'staticDissipator', 'bondingUpgrade', 'replacementValue', 'contentsValue', 'cleanupCost', 'interruptionCost'] as const
const STRUCTURE_FIELDS = ['externalId', 'kind', 'label', 'xM', 'yM', 'heightM', 'radiusM'] as const

function same<T extends Record<string, unknown>>(a: T, b: Record<string, unknown>, fields: readonly (keyof T & string)[]): boolean {
  return fields.every(f => (a[f] ?? null) === (b[f] ?? null))
}

const componentKey = (cs: { componentClass: string, count: number, heightM: number }[]) =>
  cs.map(c => `${c.componentClass}:${c.count}:${c.heightM}`).sort().join('|')

const key = (...parts: string[]) => parts.join('\u0000')

const emptyCounts = (): Counts => ({ new: 0, changed: 0, unchanged: 0 })

/** Compares the file with the organisation's inventory; finds duplicates and dangling site references. */
export async function planImport(db: Database, organisationId: string, file: ValidatedFile): Promise<ImportPlan> {
  const errors = [...file.errors]
  const existingSites = await db.select().from(sites).where(eq(sites.organisationId, organisationId))
  const siteByExternal = new Map(existingSites.map(s => [s.externalId, s]))
  const siteIdByExternal = new Map(existingSites.map(s => [s.externalId, s.id]))
  const existingTanks = await db.select(getTableColumns(tanks)).from(tanks).innerJoin(sites, eq(sites.id, tanks.siteId)).where(eq(sites.organisationId, organisationId))
  const existingComponents = existingTanks.length === 0 ? [] : await db.select(getTableColumns(tankComponents)).from(tankComponents).innerJoin(tanks, eq(tanks.id, tankComponents.tankId)).innerJoin(sites, eq(sites.id, tanks.siteId)).where(eq(sites.organisationId, organisationId))
  const componentsByTank = new Map<string, typeof existingComponents>()
  for (const c of existingComponents) componentsByTank.set(c.tankId, [...(componentsByTank.get(c.tankId) ?? []), c])
  const existingStructures = await db.select(getTableColumns(siteStructures)).from(siteStructures).innerJoin(sites, eq(sites.id, siteStructures.siteId)).where(eq(sites.organisationId, organisationId))
  const externalBySiteId = new Map(existingSites.map(s => [s.id, s.externalId]))
  const tankByKey = new Map(existingTanks.map(t => [key(externalBySiteId.get(t.siteId)!, t.externalId), t]))
  const structureByKey = new Map(existingStructures.map(s => [key(externalBySiteId.get(s.siteId)!, s.externalId), s]))

  const summary: ImportSummary = { rows: file.rowCount, sheets: file.sheets, sites: emptyCounts(), tanks: emptyCounts(), structures: emptyCounts(), errors: 0, ...(file.csv ? { readAs: csvFormatInWords(file.csv) } : {}) }

  // Sites: each external id once in the file.
  const fileSiteRow = new Map<string, number>()
  const plannedSites: ImportPlan['sites'] = []
  for (const s of file.sites) {
    const first = fileSiteRow.get(s.record.externalId)
    if (first !== undefined) { errors.push({ sheet: 'Sites', row: s.row, column: 'site_external_id', message: `Site ${s.record.externalId} appears twice (rows ${first} and ${s.row}); keep one row per site.` }); continue }
    fileSiteRow.set(s.record.externalId, s.row)
    const existing = siteByExternal.get(s.record.externalId)
    const status: RowStatus = !existing ? 'new' : same(s.record, existing, SITE_FIELDS) ? 'unchanged' : 'changed'
    plannedSites.push({ ...s, status })
    summary.sites[status]++
  }
  const siteKnown = (ext: string) => fileSiteRow.has(ext) || siteByExternal.has(ext)
  const unknownSite = (ext: string) => `Site ${ext} is neither on the Sites sheet nor in your inventory. Add it to the Sites sheet or correct site_external_id.`

  // Tanks: each (site, tank external id) once; tags unique per site after the import.
  const fileTankRow = new Map<string, number>()
  const plannedTanks: ImportPlan['tanks'] = []
  const finalTags = new Map<string, Map<string, string>>() // site → tank external id → tag
  for (const t of existingTanks) {
    const ext = externalBySiteId.get(t.siteId)!
    if (!finalTags.has(ext)) finalTags.set(ext, new Map())
    finalTags.get(ext)!.set(t.externalId, t.tag)
  }
  for (const t of file.tanks) {
    if (!siteKnown(t.siteExternalId)) { errors.push({ sheet: 'Tanks', row: t.row, column: 'site_external_id', message: unknownSite(t.siteExternalId) }); continue }
    const k = key(t.siteExternalId, t.record.externalId)
    const first = fileTankRow.get(k)
    if (first !== undefined) { errors.push({ sheet: 'Tanks', row: t.row, column: 'tank_external_id', message: `Tank ${t.record.externalId} at site ${t.siteExternalId} appears twice (rows ${first} and ${t.row}).` }); continue }
    fileTankRow.set(k, t.row)
    if (!finalTags.has(t.siteExternalId)) finalTags.set(t.siteExternalId, new Map())
    finalTags.get(t.siteExternalId)!.set(t.record.externalId, t.record.tag)
    const existing = tankByKey.get(k)
    const status: RowStatus = !existing ? 'new'
      : same(t.record, existing, TANK_FIELDS) && componentKey(t.record.components) === componentKey(componentsByTank.get(existing.id) ?? []) ? 'unchanged' : 'changed'
    plannedTanks.push({ ...t, status })
  }
  for (const t of plannedTanks) {
    const tags = finalTags.get(t.siteExternalId)!
    const clash = [...tags].find(([ext, tag]) => tag === t.record.tag && ext !== t.record.externalId)
    if (clash) {
      const otherRow = fileTankRow.get(key(t.siteExternalId, clash[0]))
      errors.push({ sheet: 'Tanks', row: t.row, column: 'tag', message: `Duplicate tag ${t.record.tag} at site ${t.siteExternalId}: tank ${clash[0]} ${otherRow ? `(row ${otherRow})` : 'in your inventory'} has it too. Tags are unique within a site.` })
    }
  }
  for (const t of plannedTanks) summary.tanks[t.status]++

  const fileStructureRow = new Map<string, number>()
  const plannedStructures: ImportPlan['structures'] = []
  for (const s of file.structures) {
    if (!siteKnown(s.siteExternalId)) { errors.push({ sheet: 'Structures', row: s.row, column: 'site_external_id', message: unknownSite(s.siteExternalId) }); continue }
    const k = key(s.siteExternalId, s.record.externalId)
    const first = fileStructureRow.get(k)
    if (first !== undefined) { errors.push({ sheet: 'Structures', row: s.row, column: 'structure_external_id', message: `Structure ${s.record.externalId} at site ${s.siteExternalId} appears twice (rows ${first} and ${s.row}).` }); continue }
    fileStructureRow.set(k, s.row)
    const existing = structureByKey.get(k)
    const status: RowStatus = !existing ? 'new' : same(s.record, existing, STRUCTURE_FIELDS) ? 'unchanged' : 'changed'
    plannedStructures.push({ ...s, status })
    summary.structures[status]++
  }

  const sheetOrder = { File: 0, Sites: 1, Tanks: 2, Structures: 3 }
  errors.sort((a, b) => sheetOrder[a.sheet] - sheetOrder[b.sheet] || a.row - b.row)
  summary.errors = errors.length
  return { summary, errors, sites: plannedSites, tanks: plannedTanks, structures: plannedStructures, siteIdByExternal }
}

const CHUNK = 1000

/** ON CONFLICT … DO UPDATE SET every given column from the proposed row. */
function excludedSet(table: PgTable, fields: readonly string[]): Record<string, SQL> {
  const columns = getTableColumns(table) as Record<string, { name: string }>
  const set: Record<string, SQL> = {}
  for (const f of fields) set[f] = sql.raw(`excluded."${columns[f]!.name}"`)
  set.updatedAt = sql`now()`
  return set
}

function siteValues(organisationId: string, r: SiteRecord) {
  return { organisationId, ...Object.fromEntries(SITE_FIELDS.map(f => [f, r[f]])) } as typeof sites.$inferInsert
}
function tankValues(siteId: string, r: TankRecord) {
  return { siteId, ...Object.fromEntries(TANK_FIELDS.map(f => [f, r[f]])) } as typeof tanks.$inferInsert
}
function structureValues(siteId: string, r: StructureRecord) {
  return { siteId, ...Object.fromEntries(STRUCTURE_FIELDS.map(f => [f, r[f]])) } as typeof siteStructures.$inferInsert
}

/** Writes the plan's new and changed rows. Call inside a transaction; the plan must have no errors. */
export async function applyImport(tx: Database, organisationId: string, plan: ImportPlan, options: { portfolioId?: string | null, onProgress?: (rowsWritten: number) => Promise<void> } = {}): Promise<void> {
  if (plan.errors.length > 0) throw new Error('an import with errors cannot be applied')
  let written = 0
  const wrote = async (n: number) => { written += n; if (options.onProgress) await options.onProgress(written) }
  const siteIds = new Map(plan.siteIdByExternal)
  const writeSites = plan.sites.filter(s => s.status !== 'unchanged')
  for (let i = 0; i < writeSites.length; i += CHUNK) {
    const rows = await tx.insert(sites).values(writeSites.slice(i, i + CHUNK).map(s => siteValues(organisationId, s.record)))
      .onConflictDoUpdate({ target: [sites.organisationId, sites.externalId], set: excludedSet(sites, SITE_FIELDS.filter(f => f !== 'externalId')) })
      .returning({ id: sites.id, externalId: sites.externalId })
    for (const r of rows) siteIds.set(r.externalId, r.id)
    await wrote(rows.length)
  }

  const writeTanks = plan.tanks.filter(t => t.status !== 'unchanged')
  // Tags may move between tanks of one site in one file (two tanks swap tags): the unique index is
  // checked row by row, so the tags that change are first parked on a placeholder no tag can equal
  // (the tank's own id), then written. The plan has checked that the final tags are unique.
  const retagged = writeTanks.filter(t => t.status === 'changed')
  for (let i = 0; i < retagged.length; i += CHUNK) {
    const wanted = sql.join(retagged.slice(i, i + CHUNK).map(t => sql`(${siteIds.get(t.siteExternalId)!}::uuid, ${t.record.externalId}::text, ${t.record.tag}::text)`), sql`, `)
    await tx.execute(sql`update tanks set tag = 'moving ' || tanks.id::text from (values ${wanted}) as w(site_id, external_id, tag)
      where tanks.site_id = w.site_id and tanks.external_id = w.external_id and tanks.tag <> w.tag`)
  }
  for (let i = 0; i < writeTanks.length; i += CHUNK) {
    const chunk = writeTanks.slice(i, i + CHUNK)
    const rows = await tx.insert(tanks).values(chunk.map(t => tankValues(siteIds.get(t.siteExternalId)!, t.record)))
      .onConflictDoUpdate({ target: [tanks.siteId, tanks.externalId], set: excludedSet(tanks, TANK_FIELDS.filter(f => f !== 'externalId')) })
      .returning({ id: tanks.id, siteId: tanks.siteId, externalId: tanks.externalId })
    const idByKey = new Map(rows.map(r => [key(r.siteId, r.externalId), r.id]))
    const ids = rows.map(r => r.id)
    await tx.delete(tankComponents).where(inArray(tankComponents.tankId, ids))
    const components = chunk.flatMap(t => t.record.components.map(c => ({ tankId: idByKey.get(key(siteIds.get(t.siteExternalId)!, t.record.externalId))!, ...c })))
    if (components.length > 0) await tx.insert(tankComponents).values(components)
    await wrote(chunk.length)
  }

  const writeStructures = plan.structures.filter(s => s.status !== 'unchanged')
  for (let i = 0; i < writeStructures.length; i += CHUNK) {
    const chunk = writeStructures.slice(i, i + CHUNK)
    await tx.insert(siteStructures).values(chunk.map(s => structureValues(siteIds.get(s.siteExternalId)!, s.record)))
      .onConflictDoUpdate({ target: [siteStructures.siteId, siteStructures.externalId], set: excludedSet(siteStructures, STRUCTURE_FIELDS.filter(f => f !== 'externalId')) })
    await wrote(chunk.length)
  }

  if (options.portfolioId && plan.sites.length > 0) {
    const ids = plan.sites.map(s => siteIds.get(s.record.externalId)!)
    for (let i = 0; i < ids.length; i += CHUNK) {
      await tx.insert(portfolioSites).values(ids.slice(i, i + CHUNK).map(siteId => ({ portfolioId: options.portfolioId!, siteId }))).onConflictDoNothing()
    }
  }
}
