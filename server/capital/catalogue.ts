// The organisation's mitigation catalogue and candidate actions, as the engine and the planner see them.
import { and, asc, eq, inArray } from 'drizzle-orm'
import type { ActionEffect, OptionEffect } from '../../shared/capital/actions'
import type { Database } from '../db'
import { auditEvents, capitalActions, mitigationOptions, sites, tanks } from '../db/schema'

export type OptionRow = typeof mitigationOptions.$inferSelect

/** The catalogue an organisation starts with (illustrative costs, in its own currency — edit them). */
export const STARTER_CATALOGUE: Array<Omit<typeof mitigationOptions.$inferInsert, 'organisationId'>> = [
  { kind: 'shield', name: 'Induced-sparking shield 150 kA', shieldRatingKa: 150, fixedCost: 6000, rate: 2500, costBasis: 'diameter_m' },
  { kind: 'remove_class', name: 'Non-conducting level float and gauge', componentClass: 'sharp_device', fixedCost: 2000, rate: 1500, costBasis: 'component_count' },
  { kind: 'remove_class', name: 'Non-conducting fill pipe', componentClass: 'grounded_pipe', fixedCost: 3000, rate: 2500, costBasis: 'component_count' },
  { kind: 'steel_tank', name: 'Replace with a steel tank', fixedCost: 20000, rate: 450, costBasis: 'volume_m3' },
  { kind: 'vapour_control', name: 'Vapour recovery and inerting', fixedCost: 15000, rate: 0, costBasis: 'each' },
  { kind: 'mast', name: 'Lightning mast 30 m', mastHeightM: 30, mastRadiusM: 0.3, fixedCost: 45000, rate: 0, costBasis: 'each' },
  { kind: 'grounding', name: 'Grounding and bonding upgrade', fixedCost: 4000, rate: 0, costBasis: 'each' },
  { kind: 'static_dissipator', name: 'Static dissipator', fixedCost: 3500, rate: 0, costBasis: 'each' },
]

/** Adds the starter catalogue when the organisation has none yet (and never deleted one: then an empty catalogue is what it chose). */
export async function ensureCatalogue(db: Database, organisationId: string): Promise<void> {
  const [any] = await db.select({ id: mitigationOptions.id }).from(mitigationOptions).where(eq(mitigationOptions.organisationId, organisationId)).limit(1)
  if (any) return
  const [deleted] = await db.select({ id: auditEvents.id }).from(auditEvents)
    .where(and(eq(auditEvents.organisationId, organisationId), eq(auditEvents.entity, 'mitigation_option'), eq(auditEvents.action, 'delete'))).limit(1)
  if (deleted) return
  await db.insert(mitigationOptions).values(STARTER_CATALOGUE.map(o => ({ ...o, organisationId }))).onConflictDoNothing()
}

export function optionEffect(o: OptionRow): OptionEffect {
  return { kind: o.kind, shieldRatingKa: o.shieldRatingKa, componentClass: o.componentClass, mastHeightM: o.mastHeightM, mastRadiusM: o.mastRadiusM }
}

export interface ActionRow {
  id: string
  optionId: string
  optionName: string
  kind: OptionRow['kind']
  siteId: string
  siteName: string
  tankId: string | null
  tankTag: string | null
  mastXM: number | null
  mastYM: number | null
  cost: number
  note: string
}

/** Candidate actions of the organisation (optionally only the given ids), in a stable order. */
export async function listActions(db: Database, organisationId: string, ids?: string[]): Promise<Array<ActionRow & { effect: ActionEffect }>> {
  if (ids && ids.length === 0) return []
  const rows = await db.select({ a: capitalActions, o: mitigationOptions, siteName: sites.name, tankTag: tanks.tag })
    .from(capitalActions)
    .innerJoin(mitigationOptions, eq(mitigationOptions.id, capitalActions.optionId))
    .innerJoin(sites, eq(sites.id, capitalActions.siteId))
    .leftJoin(tanks, eq(tanks.id, capitalActions.tankId))
    .where(and(eq(capitalActions.organisationId, organisationId), ids ? inArray(capitalActions.id, ids) : undefined))
    .orderBy(asc(sites.name), asc(tanks.tag), asc(mitigationOptions.name), asc(capitalActions.id))
  return rows.map(({ a, o, siteName, tankTag }) => ({
    id: a.id, optionId: o.id, optionName: o.name, kind: o.kind, siteId: a.siteId, siteName, tankId: a.tankId, tankTag,
    mastXM: a.mastXM, mastYM: a.mastYM, cost: a.cost, note: a.note,
    effect: { id: a.id, option: optionEffect(o), tankId: a.tankId, mastXM: a.mastXM, mastYM: a.mastYM },
  }))
}
