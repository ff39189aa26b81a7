// Working a stored storm batch: its organisation's unassigned flashes join storm windows (a gap of
// STORM_WINDOW_GAP_MS or more starts a new one; windows the batch bridges are merged), every window
// touched is computed again from all its flashes against all the organisation's sites, and tanks
// newly above the organisation's alert threshold are e-mailed to the people who asked. All of it
// commits in one transaction, serialised per organisation.
import { and, asc, desc, eq, gte, inArray, isNull, lte, sql } from 'drizzle-orm'
import { ENGINE_VERSION } from '../../shared/engine'
import { parseAssumptions, type AssumptionSet } from '../../shared/engine/assumptions'
import { computeStormWindow, StormSiteIndex, windowTotals, type StormFlashRecord } from '../../shared/storms/compute'
import { DEFAULT_STORM_QUADRATURE } from '../../shared/engine/storm'
import { useDb, type Database } from '../db'
import { withClientTransaction } from '../db/transaction'
import {
  assumptionSets, assumptionSetVersions, memberships, organisations, sites, stormAlerts, stormAlertSettings, stormAlertSubscribers,
  stormBatches, stormFlashes, stormSiteResults, stormTankResults, stormWindows, tanks, users,
} from '../db/schema'
import { queueOptions, useBoss } from '../jobs/queue'
import { stormAlertMail } from '../mail/templates'
import { snapshotSites } from '../runs/snapshot'
import { recordAudit } from '../utils/audit'
import { settings } from '../settings'
import type PgBoss from 'pg-boss'

/** Flashes less than an hour apart belong to one storm window (common practice in storm reports). */
export const STORM_WINDOW_GAP_MS = 60 * 60 * 1000

export async function processStormBatch(batchId: string): Promise<void> {
  const boss = await useBoss()
  await withClientTransaction(async ({ tx, bossDb }) => {
    const [batch] = await tx.select().from(stormBatches).where(eq(stormBatches.id, batchId)).for('update')
    if (!batch || batch.state === 'processed') return
    const organisationId = batch.organisationId
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`storm-windows:${organisationId}`}))`)
    const touched = await assignWindows(tx, organisationId)
    for (const windowId of touched) await computeWindow(tx, organisationId, windowId)
    await tx.update(stormBatches).set({ state: 'processed', processedAt: new Date(), error: null }).where(eq(stormBatches.id, batchId))
    await sendAlerts(tx, bossDb, boss, organisationId, [...touched])
  })
}

/** A batch no attempt is left for: marked failed with the reason (its records stay stored; a new batch re-runs the windows). */
export async function failStormBatch(batchId: string, reason: string): Promise<void> {
  await useDb().update(stormBatches).set({ state: 'failed', error: reason.slice(0, 500) }).where(and(eq(stormBatches.id, batchId), sql`${stormBatches.state} <> 'processed'`))
}

interface WindowSpan { id: string | null, startsAt: number, endsAt: number, flashIds: string[], merged: string[] }

/** Puts every unassigned flash of the organisation into a window; returns the ids of the windows changed. */
async function assignWindows(tx: Database, organisationId: string): Promise<Set<string>> {
  const loose = await tx.select({ id: stormFlashes.id, at: stormFlashes.occurredAt }).from(stormFlashes)
    .where(and(eq(stormFlashes.organisationId, organisationId), isNull(stormFlashes.windowId))).orderBy(asc(stormFlashes.occurredAt))
  if (loose.length === 0) return new Set()
  const first = loose[0]!.at.getTime(), last = loose[loose.length - 1]!.at.getTime()
  const existing = await tx.select({ id: stormWindows.id, startsAt: stormWindows.startsAt, endsAt: stormWindows.endsAt }).from(stormWindows)
    .where(and(eq(stormWindows.organisationId, organisationId), lte(stormWindows.startsAt, new Date(last + STORM_WINDOW_GAP_MS)), gte(stormWindows.endsAt, new Date(first - STORM_WINDOW_GAP_MS))))
  const spans: WindowSpan[] = existing.map(w => ({ id: w.id, startsAt: w.startsAt.getTime(), endsAt: w.endsAt.getTime(), flashIds: [], merged: [] }))
  for (const f of loose) {
    const t = f.at.getTime()
    let span = spans.find(s => t >= s.startsAt - STORM_WINDOW_GAP_MS && t <= s.endsAt + STORM_WINDOW_GAP_MS)
    if (!span) { span = { id: null, startsAt: t, endsAt: t, flashIds: [], merged: [] }; spans.push(span) }
    span.startsAt = Math.min(span.startsAt, t)
    span.endsAt = Math.max(span.endsAt, t)
    span.flashIds.push(f.id)
  }
  // Windows the new flashes bridge become one (the earliest existing window keeps its id).
  spans.sort((a, b) => a.startsAt - b.startsAt)
  const kept: WindowSpan[] = []
  for (const s of spans) {
    const prev = kept[kept.length - 1]
    if (prev && s.startsAt - prev.endsAt < STORM_WINDOW_GAP_MS) {
      prev.endsAt = Math.max(prev.endsAt, s.endsAt)
      prev.flashIds.push(...s.flashIds)
      if (s.id) { if (prev.id) prev.merged.push(s.id); else prev.id = s.id }
      prev.merged.push(...s.merged)
    } else kept.push(s)
  }
  const changed = new Set<string>()
  for (const s of kept) {
    if (s.flashIds.length === 0 && s.merged.length === 0) continue
    let id = s.id
    if (!id) {
      const [row] = await tx.insert(stormWindows).values({ organisationId, startsAt: new Date(s.startsAt), endsAt: new Date(s.endsAt) }).returning({ id: stormWindows.id })
      id = row!.id
    } else {
      await tx.update(stormWindows).set({ startsAt: new Date(s.startsAt), endsAt: new Date(s.endsAt), state: 'pending' }).where(eq(stormWindows.id, id))
    }
    if (s.merged.length) {
      await tx.update(stormFlashes).set({ windowId: id }).where(inArray(stormFlashes.windowId, s.merged))
      await tx.delete(stormWindows).where(inArray(stormWindows.id, s.merged))
    }
    for (let i = 0; i < s.flashIds.length; i += 5000) {
      await tx.update(stormFlashes).set({ windowId: id }).where(inArray(stormFlashes.id, s.flashIds.slice(i, i + 5000)))
    }
    changed.add(id)
  }
  return changed
}

/** The organisation's newest assumption version (of a set in use), or the documented defaults. */
async function currentAssumptions(tx: Database, organisationId: string): Promise<{ id: string | null, assumptions: AssumptionSet }> {
  const [row] = await tx.select({ id: assumptionSetVersions.id, parameters: assumptionSetVersions.parameters }).from(assumptionSetVersions)
    .innerJoin(assumptionSets, eq(assumptionSets.id, assumptionSetVersions.assumptionSetId))
    .where(and(eq(assumptionSets.organisationId, organisationId), isNull(assumptionSets.archivedAt)))
    .orderBy(desc(assumptionSetVersions.createdAt), desc(assumptionSetVersions.version)).limit(1)
  if (!row) return { id: null, assumptions: parseAssumptions({}) }
  return { id: row.id, assumptions: parseAssumptions(row.parameters) }
}

/** Every flash of the window against every site of the organisation; replaces the window's results. */
export async function computeWindow(tx: Database, organisationId: string, windowId: string): Promise<void> {
  const flashes = await tx.select().from(stormFlashes).where(eq(stormFlashes.windowId, windowId)).orderBy(asc(stormFlashes.occurredAt), asc(stormFlashes.id))
  const { id: versionId, assumptions } = await currentAssumptions(tx, organisationId)
  const siteRows = await tx.select().from(sites).where(eq(sites.organisationId, organisationId)).orderBy(asc(sites.id))
  const snapshot = await snapshotSites(tx, siteRows, assumptions)
  const index = new StormSiteIndex(snapshot.map(s => ({ latDeg: s.facts.latitudeDeg, lonDeg: s.facts.longitudeDeg, input: s.site })), assumptions)
  const records: StormFlashRecord[] = flashes.map(f => ({ id: f.id, latDeg: f.latDeg, lonDeg: f.lonDeg, peakCurrentKa: f.peakCurrentKa, type: f.type, locationErrorKm: f.locationErrorKm }))
  const result = computeStormWindow(index, records)
  const totals = windowTotals(result)
  await tx.delete(stormTankResults).where(eq(stormTankResults.windowId, windowId))
  for (let i = 0; i < result.tanks.length; i += 1000) {
    await tx.insert(stormTankResults).values(result.tanks.slice(i, i + 1000).map(t => ({ windowId, ...t })))
  }
  await tx.delete(stormSiteResults).where(eq(stormSiteResults.windowId, windowId))
  for (let i = 0; i < result.sites.length; i += 500) {
    await tx.insert(stormSiteResults).values(result.sites.slice(i, i + 500).map(s => ({
      windowId, siteId: s.siteId, lossModel: s.lossModel, expectedGroundUpLoss: Math.round(s.expectedGroundUpLoss * 100) / 100,
    })))
  }
  const times = flashes.map(f => f.occurredAt.getTime())
  await tx.update(stormWindows).set({
    flashCount: flashes.length, state: 'computed', assumptionVersionId: versionId, engineVersion: ENGINE_VERSION, computedAt: new Date(),
    startsAt: new Date(Math.min(...times)), endsAt: new Date(Math.max(...times)),
    expectedFires: totals.expectedFires, expectedGroundUpLoss: Math.round(totals.expectedGroundUpLoss * 100) / 100,
    summary: {
      groundFlashes: result.groundFlashes, cloudRecordsLeftOut: result.cloudRecordsLeftOut, flashesNearSites: result.flashesNearSites,
      flashSitePairs: result.pairs, sites: snapshot.length, tanksWithProbability: result.tanks.length,
      quadrature: DEFAULT_STORM_QUADRATURE, gapMinutes: STORM_WINDOW_GAP_MS / 60000, locationError: 'σ per axis of a circular Gaussian; records without one taken as exact',
    },
  }).where(eq(stormWindows.id, windowId))
}

/** Tanks newly at or above the threshold in each window: one alert row, audited, and one mail job per subscriber. */
async function sendAlerts(tx: Database, bossDb: PgBoss.Db, boss: PgBoss, organisationId: string, windowIds: string[]): Promise<void> {
  const [setting] = await tx.select().from(stormAlertSettings).where(eq(stormAlertSettings.organisationId, organisationId))
  if (!setting || windowIds.length === 0) return
  const recipients = await tx.select({ email: users.email }).from(stormAlertSubscribers)
    .innerJoin(memberships, and(eq(memberships.userId, stormAlertSubscribers.userId), eq(memberships.organisationId, organisationId)))
    .innerJoin(users, eq(users.id, stormAlertSubscribers.userId))
    .where(and(eq(stormAlertSubscribers.organisationId, organisationId), eq(users.disabled, false))).orderBy(asc(users.email))
  const [org] = await tx.select({ name: organisations.name }).from(organisations).where(eq(organisations.id, organisationId))
  for (const windowId of windowIds) {
    const above = await tx.select({ tankId: stormTankResults.tankId, ignition: stormTankResults.ignition, tag: tanks.tag, siteName: sites.name })
      .from(stormTankResults).innerJoin(tanks, eq(tanks.id, stormTankResults.tankId)).innerJoin(sites, eq(sites.id, stormTankResults.siteId))
      .where(and(eq(stormTankResults.windowId, windowId), gte(stormTankResults.ignition, setting.ignitionThreshold)))
      .orderBy(desc(stormTankResults.ignition), asc(tanks.tag))
    if (above.length === 0) continue
    const earlier = await tx.select({ tanks: stormAlerts.tanks }).from(stormAlerts).where(eq(stormAlerts.windowId, windowId))
    const alerted = new Set(earlier.flatMap(a => (a.tanks as Array<{ tankId: string }>).map(t => t.tankId)))
    const fresh = above.filter(t => !alerted.has(t.tankId))
    if (fresh.length === 0) continue
    const [window] = await tx.select({ startsAt: stormWindows.startsAt, endsAt: stormWindows.endsAt }).from(stormWindows).where(eq(stormWindows.id, windowId))
    const [alert] = await tx.insert(stormAlerts).values({
      organisationId, windowId, ignitionThreshold: setting.ignitionThreshold, tanks: fresh, recipients: recipients.map(r => r.email),
    }).returning({ id: stormAlerts.id })
    await recordAudit({
      organisationId, userId: null, action: 'alert', entity: 'storm_alert', entityId: alert!.id,
      after: { windowId, threshold: setting.ignitionThreshold, tanks: fresh.length, highest: fresh[0]!.ignition, recipients: recipients.length },
    }, { tx })
    if (recipients.length === 0) continue
    const mail = stormAlertMail({
      organisationName: org?.name ?? '', threshold: setting.ignitionThreshold, tanks: fresh,
      windowLabel: `of ${window!.startsAt.toISOString().slice(0, 16).replace('T', ' ')} to ${window!.endsAt.toISOString().slice(11, 16)} UTC`,
      link: `${settings.publicUrl}/storms/${windowId}`,
    })
    await boss.insert(recipients.map(r => ({ name: 'mail.send', data: { to: r.email, subject: mail.subject, text: mail.text, organisationId }, ...queueOptions['mail.send'] })), { db: bossDb })
  }
}
