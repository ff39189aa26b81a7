// Lightning calibration: upload a records file, then per chosen site Ng with its interval and the
// current fit (per site and pooled over the sites), stored with the inputs that made them.
import { createError, type H3Event } from 'h3'
import { createHash } from 'node:crypto'
import { and, eq } from 'drizzle-orm'
import {
  analyseSite, currentFitCurves, empiricalExceedance, poolCurrents, tryFit, type CurrentSample, type SiteLightningResult,
} from '../../shared/calibration'
import type { LightningCalibrationInput } from '../../shared/schemas/calibration'
import { useDb } from '../db'
import { calibrationFiles, calibrations } from '../db/schema'
import type { Member } from '../utils/auth'
import { recordAudit } from '../utils/audit'
import { badRequest, notFound } from '../utils/errors'
import { collectNearSites, GROUPING_MARGIN_KM, ingestLightningFile, type LightningSummary } from './lightning-files'
import { findSites } from './sites'
import { calibrationContent, forgetCalibrationContent, storeCalibrationContent } from './files'

export async function storeLightningFile(member: Member, event: H3Event, fileName: string, body: AsyncIterable<Buffer>) {
  const result = await ingestLightningFile(body)
  if (!result.ok) {
    throw createError({ statusCode: 400, statusMessage: result.message, data: { rowErrors: result.rowErrors, errorCount: result.errorCount, rows: result.rows } })
  }
  // The file goes to object storage first: a failed put leaves no row; a failed transaction removes the object.
  const content = await storeCalibrationContent(member.organisationId, result.gzip)
  return useDb().transaction(async (tx) => {
    const [file] = await tx.insert(calibrationFiles).values({
      organisationId: member.organisationId, kind: 'lightning', fileName, byteSize: result.bytes, rowCount: result.summary.rows,
      sha256: result.sha256, ...content, summary: result.summary, uploadedBy: member.user.id,
    }).returning({ id: calibrationFiles.id, fileName: calibrationFiles.fileName, rowCount: calibrationFiles.rowCount, byteSize: calibrationFiles.byteSize, sha256: calibrationFiles.sha256, createdAt: calibrationFiles.createdAt })
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'upload', entity: 'calibration_file', entityId: file!.id, after: { kind: 'lightning', fileName, rows: result.summary.rows, bytes: result.bytes, sha256: result.sha256 } }, { tx, event })
    return { ...file!, summary: result.summary }
  }).catch(async (error: unknown) => {
    await forgetCalibrationContent(content.contentKey)
    throw error
  })
}

export interface LightningSiteRow extends SiteLightningResult {
  externalId: string
  name: string
  latDeg: number
  lonDeg: number
  /** The site's flash density before this calibration (null when it had thunderstorm days). */
  previousFlashDensity: number | null
}

export async function runLightningCalibration(member: Member, event: H3Event, input: LightningCalibrationInput) {
  const db = useDb()
  const [file] = await db.select().from(calibrationFiles)
    .where(and(eq(calibrationFiles.id, input.fileId), eq(calibrationFiles.organisationId, member.organisationId), eq(calibrationFiles.kind, 'lightning')))
  if (!file) notFound('Lightning records file')
  const sites = await findSites(member.organisationId, [...new Set(input.siteIds)])
  if (sites.length !== new Set(input.siteIds).size) notFound('Site')
  const summary = file.summary as LightningSummary
  const periodYears = input.periodYears ?? summary.spanYears
  if (!(periodYears > 0)) badRequest('The records cover no time span; enter the record period in years.')

  const { perSite, leftOutForLocationError } = await collectNearSites(await calibrationContent(file), sites, {
    radiusKm: input.radiusKm, marginKm: input.recordsAre === 'strokes' ? GROUPING_MARGIN_KM : 0, maxLocationErrorKm: input.maxLocationErrorKm,
  })
  const options = { radiusKm: input.radiusKm, periodYears, detectionEfficiency: input.detectionEfficiency, thresholdKa: input.thresholdKa, recordsAre: input.recordsAre }
  const currents: CurrentSample[][] = []
  const siteRows: LightningSiteRow[] = []
  // A CalibrationInputError answers 400 with its message (server/plugins/errors.ts).
  for (const site of sites) {
    const { result, currents: c } = analyseSite(site.id, perSite.get(site.id) ?? [], options)
    currents.push(c)
    siteRows.push({ ...result, externalId: site.externalId, name: site.name, latDeg: site.latDeg, lonDeg: site.lonDeg, previousFlashDensity: site.flashDensity })
  }
  const pooledCurrents = poolCurrents(currents)
  const pooled = tryFit(pooledCurrents, input.thresholdKa)
  const results = {
    periodYears,
    periodSource: input.periodYears === null ? 'span of the records' : 'stated',
    leftOutForLocationError,
    recordsExtent: { latitudeRange: summary.latitudeRange, longitudeRange: summary.longitudeRange },
    sites: siteRows,
    pooled: {
      currents: pooledCurrents.length,
      fit: pooled.fit,
      fitProblem: pooled.problem,
      empirical: empiricalExceedance(pooledCurrents),
      curves: pooled.fit ? currentFitCurves(pooled.fit, input.thresholdKa) : [],
    },
    file: { id: file.id, name: file.fileName, sha256: file.sha256, rows: file.rowCount },
  }
  return db.transaction(async (tx) => {
    const [row] = await tx.insert(calibrations).values({
      organisationId: member.organisationId, kind: 'lightning', title: input.title, fileId: file.id, inputs: input, results, createdBy: member.user.id,
    }).returning()
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'create', entity: 'calibration', entityId: row!.id, after: { kind: 'lightning', title: input.title, fileId: file.id, sites: sites.length, pooledFit: pooled.fit ? { medianKa: pooled.fit.medianKa, beta: pooled.fit.beta } : null } }, { tx, event })
    return row!
  })
}

export function sha256(text: string | Buffer): string {
  return createHash('sha256').update(text).digest('hex')
}
