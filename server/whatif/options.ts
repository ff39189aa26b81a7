// Saved what-if options: stored per organisation (with the run, site and tank the what-if was opened
// from), listed, deleted, and sent to the capital plan as a candidate action through the capital
// plan's own action service (server/capital/create-actions.ts). Every change is audited.
import { and, desc, eq } from 'drizzle-orm'
import type { H3Event } from 'h3'
import type { z } from 'zod'
import type { saveWhatIfOptionSchema } from '../../shared/schemas/whatif'
import type { SiteInput } from '../../shared/engine/types'
import { useDb } from '../db'
import { capitalActions, mitigationOptions, runs, runSiteSnapshots, tanks, users, whatifOptions } from '../db/schema'
import { createActions } from '../capital/create-actions'
import { recordAudit } from '../utils/audit'
import { AppError } from '../utils/errors'

type SaveInput = z.output<typeof saveWhatIfOptionSchema>
interface By { organisationId: string, userId: string }

const listColumns = {
  option: whatifOptions,
  createdByName: users.name,
  runName: runs.name,
  action: { id: capitalActions.id, cost: capitalActions.cost, optionName: mitigationOptions.name },
}

function present(row: { option: typeof whatifOptions.$inferSelect, createdByName: string | null, runName: string | null, action: { id: string | null, cost: number | null, optionName: string | null } | null }) {
  const o = row.option
  return {
    id: o.id, label: o.label, runId: o.runId, runName: row.runName, siteId: o.siteId, tankId: o.tankId, tankTag: o.tankTag,
    params: o.params, changes: o.changes, figures: o.figures, baselineFigures: o.baselineFigures, engineVersion: o.engineVersion,
    savedAt: o.createdAt, savedBy: row.createdByName,
    sentAction: row.action?.id ? { id: row.action.id, cost: row.action.cost, optionName: row.action.optionName, mastXM: o.mastXM, mastYM: o.mastYM } : null,
  }
}
export type WhatIfOptionView = ReturnType<typeof present>

/** The organisation's saved options, newest first; of one run's site when asked. */
export async function listWhatIfOptions(organisationId: string, filter: { runId?: string, siteId?: string } = {}) {
  const rows = await useDb().select(listColumns).from(whatifOptions)
    .leftJoin(users, eq(users.id, whatifOptions.createdBy))
    .leftJoin(runs, eq(runs.id, whatifOptions.runId))
    .leftJoin(capitalActions, eq(capitalActions.id, whatifOptions.capitalActionId))
    .leftJoin(mitigationOptions, eq(mitigationOptions.id, capitalActions.optionId))
    .where(and(
      eq(whatifOptions.organisationId, organisationId),
      filter.runId ? eq(whatifOptions.runId, filter.runId) : undefined,
      filter.siteId ? eq(whatifOptions.siteId, filter.siteId) : undefined,
    ))
    .orderBy(desc(whatifOptions.createdAt)).limit(200)
  return rows.map(present)
}

async function getWhatIfOption(organisationId: string, id: string) {
  const [row] = await useDb().select(listColumns).from(whatifOptions)
    .leftJoin(users, eq(users.id, whatifOptions.createdBy))
    .leftJoin(runs, eq(runs.id, whatifOptions.runId))
    .leftJoin(capitalActions, eq(capitalActions.id, whatifOptions.capitalActionId))
    .leftJoin(mitigationOptions, eq(mitigationOptions.id, capitalActions.optionId))
    .where(and(eq(whatifOptions.id, id), eq(whatifOptions.organisationId, organisationId)))
  return row ? present(row) : null
}

export async function saveWhatIfOption(input: SaveInput, by: By, event?: H3Event) {
  let tankTag: string | null = null
  if (input.runId && input.siteId) {
    const [run] = await useDb().select({ id: runs.id }).from(runs).where(and(eq(runs.id, input.runId), eq(runs.organisationId, by.organisationId)))
    if (!run) throw new AppError(404, 'Run not found.')
    const [snapshot] = await useDb().select({ site: runSiteSnapshots.site }).from(runSiteSnapshots)
      .where(and(eq(runSiteSnapshots.runId, input.runId), eq(runSiteSnapshots.siteId, input.siteId)))
    if (!snapshot) throw new AppError(404, 'Site not found.')
    if (input.tankId) {
      const tank = (snapshot.site as SiteInput).tanks.find(t => t.id === input.tankId)
      if (!tank) throw new AppError(404, 'Tank not found.')
      tankTag = tank.tag
    }
  }
  const label = input.label || (input.changes.length ? input.changes.map(c => `${c.label} ${c.to}${c.unit && c.unit !== 'log' ? ` ${c.unit}` : ''}`).join(', ').slice(0, 120) : 'No change from the starting point')
  const id = await useDb().transaction(async (tx) => {
    const [row] = await tx.insert(whatifOptions).values({
      organisationId: by.organisationId, runId: input.runId, siteId: input.siteId, tankId: input.tankId, tankTag,
      label, params: input.params, changes: input.changes, figures: input.figures, baselineFigures: input.baselineFigures,
      engineVersion: input.engineVersion, createdBy: by.userId,
    }).returning({ id: whatifOptions.id })
    await recordAudit({ organisationId: by.organisationId, userId: by.userId, action: 'create', entity: 'whatif_option', entityId: row!.id, after: { label, tank: tankTag, run: input.runId, changes: input.changes.map(c => `${c.label}: ${c.from} → ${c.to}`) } }, { tx, event })
    return row!.id
  })
  return (await getWhatIfOption(by.organisationId, id))!
}

export async function deleteWhatIfOption(id: string, by: By, event?: H3Event) {
  await useDb().transaction(async (tx) => {
    const [row] = await tx.delete(whatifOptions).where(and(eq(whatifOptions.id, id), eq(whatifOptions.organisationId, by.organisationId))).returning()
    if (!row) throw new AppError(404, 'Saved option not found.')
    await recordAudit({ organisationId: by.organisationId, userId: by.userId, action: 'delete', entity: 'whatif_option', entityId: id, before: { label: row.label, tank: row.tankTag, run: row.runId } }, { tx, event })
  })
}

/**
 * Sends a saved option to the capital plan: one candidate action with the chosen catalogue option on
 * the option's tank, or, for a mast, on its site at the what-if's distance due east of the tank's axis.
 * An option already sent answers 409 with the action it became.
 */
export async function sendWhatIfOption(id: string, catalogueOptionId: string, by: By, event?: H3Event) {
  const db = useDb()
  const sent = await db.transaction(async (tx) => {
    const [row] = await tx.select().from(whatifOptions).where(and(eq(whatifOptions.id, id), eq(whatifOptions.organisationId, by.organisationId))).for('update')
    if (!row) throw new AppError(404, 'Saved option not found.')
    if (row.capitalActionId) throw new AppError(409, 'This option is already in the capital plan.')
    if (!row.tankId || !row.siteId) throw new AppError(409, 'Only an option saved from a run’s tank can go to the capital plan: open the what-if from the tank on a site’s results.', { optionId: 'Open the what-if from a tank of a run to send it.' })
    const [tank] = await tx.select({ id: tanks.id, siteId: tanks.siteId, xM: tanks.xM, yM: tanks.yM }).from(tanks).where(eq(tanks.id, row.tankId))
    if (!tank) throw new AppError(409, `Tank ${row.tankTag ?? ''} is no longer in the inventory.`.replace('  ', ' '))
    const [catalogue] = await tx.select({ kind: mitigationOptions.kind, name: mitigationOptions.name }).from(mitigationOptions)
      .where(and(eq(mitigationOptions.id, catalogueOptionId), eq(mitigationOptions.organisationId, by.organisationId)))
    if (!catalogue) throw new AppError(404, 'Option not found.', { optionId: 'Choose an option of the catalogue.' })
    const mast = catalogue.kind === 'mast' ? { xM: tank.xM + row.params.mastDistanceM, yM: tank.yM } : null
    const created = await createActions(tx, by.organisationId, by.userId, mast
      ? { optionId: catalogueOptionId, siteId: tank.siteId, mastXM: mast.xM, mastYM: mast.yM, note: `From the what-if "${row.label}"`.slice(0, 500) }
      : { optionId: catalogueOptionId, tankIds: [tank.id], note: `From the what-if "${row.label}"`.slice(0, 500) })
    const action = created[0]
    if (!action) throw new AppError(409, `Tank ${row.tankTag ?? ''} already has the action "${catalogue.name}" in the capital plan.`.replace('  ', ' '))
    await tx.update(whatifOptions).set({ capitalActionId: action.id, mastXM: mast?.xM ?? null, mastYM: mast?.yM ?? null }).where(eq(whatifOptions.id, id))
    await recordAudit({ organisationId: by.organisationId, userId: by.userId, action: 'create', entity: 'capital_action', entityId: action.id, after: { option: catalogue.name, tank: row.tankTag, fromWhatIf: row.label, ...(mast ? { mastXM: mast.xM, mastYM: mast.yM } : {}) } }, { tx, event })
    return action.id
  })
  return { actionId: sent, option: (await getWhatIfOption(by.organisationId, id))! }
}
