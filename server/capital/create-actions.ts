// Candidate actions from an option: on chosen tanks, on every tank matching a filter, or a mast
// on a site; each priced by the option's cost rule.
import { and, eq, gte, inArray, type SQL } from 'drizzle-orm'
import type { z } from 'zod'
import { actionCost } from '../../shared/capital/costs'
import type { TankInput } from '../../shared/engine/types'
import type { createActionsSchema } from '../../shared/schemas/capital'
import type { Database } from '../db'
import { capitalActions, mitigationOptions, sites, tankComponents, tanks } from '../db/schema'
import { optionEffect, type OptionRow } from './catalogue'
import { AppError } from '../utils/errors'

export type CreateActions = z.output<typeof createActionsSchema>

/** The tank measures a cost rule needs. */
type CostTank = Pick<TankInput, 'diameterM' | 'heightM' | 'components'>

export async function costTanks(db: Database, tankIds: string[]): Promise<Map<string, CostTank>> {
  if (tankIds.length === 0) return new Map()
  const rows = await db.select({ id: tanks.id, diameterM: tanks.diameterM, heightM: tanks.heightM }).from(tanks).where(inArray(tanks.id, tankIds))
  const parts = await db.select().from(tankComponents).where(inArray(tankComponents.tankId, tankIds))
  return new Map(rows.map(t => [t.id, { diameterM: t.diameterM, heightM: t.heightM, components: parts.filter(p => p.tankId === t.id).map(p => ({ componentClass: p.componentClass, count: p.count, heightM: p.heightM })) }]))
}

export function priceAction(option: OptionRow, tank: CostTank | null): number {
  return actionCost({ fixedCost: option.fixedCost, rate: option.rate, basis: option.costBasis }, (tank ?? null) as TankInput | null, optionEffect(option), option.costStep)
}

export async function createActions(tx: Database, organisationId: string, userId: string, input: CreateActions) {
  const [option] = await tx.select().from(mitigationOptions).where(and(eq(mitigationOptions.id, input.optionId), eq(mitigationOptions.organisationId, organisationId)))
  if (!option) throw new AppError(404, 'Option not found.')
  if (option.archivedAt) throw new AppError(409, `The option "${option.name}" is archived. Restore it in the catalogue to add actions with it.`)
  if (option.kind === 'mast') {
    if (!input.siteId || input.mastXM === undefined || input.mastYM === undefined) throw new AppError(400, 'A mast needs a site and its position (x and y in m).')
    const [site] = await tx.select({ id: sites.id }).from(sites).where(and(eq(sites.id, input.siteId), eq(sites.organisationId, organisationId)))
    if (!site) throw new AppError(404, 'Site not found.')
    return tx.insert(capitalActions).values({ organisationId, optionId: option.id, siteId: site.id, tankId: null, mastXM: input.mastXM, mastYM: input.mastYM, cost: priceAction(option, null), note: input.note, createdBy: userId }).returning()
  }
  const conditions: SQL[] = [eq(sites.organisationId, organisationId)]
  if (input.tankIds) conditions.push(inArray(tanks.id, input.tankIds.length ? input.tankIds : ['00000000-0000-0000-0000-000000000000']))
  if (input.filter?.material) conditions.push(eq(tanks.material, input.filter.material))
  if (input.filter?.contents) conditions.push(eq(tanks.contents, input.filter.contents))
  if (input.filter?.minHeightM !== undefined) conditions.push(gte(tanks.heightM, input.filter.minHeightM))
  if (input.filter?.siteId) conditions.push(eq(tanks.siteId, input.filter.siteId))
  const matching = await tx.select({ id: tanks.id, siteId: tanks.siteId, heightM: tanks.heightM }).from(tanks).innerJoin(sites, eq(sites.id, tanks.siteId)).where(and(...conditions))
  // "taller than 5 m" is strict; the query's ≥ keeps the index-friendly form, the strictness is applied here.
  const chosen = input.filter?.minHeightM !== undefined ? matching.filter(t => t.heightM > input.filter!.minHeightM!) : matching
  if (input.tankIds && chosen.length !== new Set(input.tankIds).size) throw new AppError(404, 'Tank not found.')
  if (chosen.length === 0) return []
  const measures = await costTanks(tx, chosen.map(t => t.id))
  return tx.insert(capitalActions).values(chosen.map(t => ({
    organisationId, optionId: option.id, siteId: t.siteId, tankId: t.id, cost: priceAction(option, measures.get(t.id) ?? null), note: input.note, createdBy: userId,
  }))).onConflictDoNothing().returning()
}
