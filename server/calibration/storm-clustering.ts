// Storm clustering calibration: from a stored lightning-location file, the ground flashes inside a
// region, cut into time windows, fitted as a Thomas process (shared/calibration/cluster-fit.ts) with
// bootstrap intervals; stored and audited like the other calibrations.
import type { H3Event } from 'h3'
import { Readable } from 'node:stream'
import { createGunzip } from 'node:zlib'
import { and, eq } from 'drizzle-orm'
import { fitStormClustering, type ClusterRecord, type LatLonBox } from '../../shared/calibration/cluster-fit'
import { groupIntoFlashes, isRecord, parseLightningRow, readLightningHeader, splitCsvLine, type NearbyStroke } from '../../shared/calibration'
import type { StormClusteringCalibrationInput } from '../../shared/schemas/calibration'
import { useDb } from '../db'
import { calibrationFiles, calibrations } from '../db/schema'
import type { Member } from '../utils/auth'
import { recordAudit } from '../utils/audit'
import { badRequest, notFound } from '../utils/errors'
import { calibrationContent } from './files'
import type { LightningSummary } from './lightning-files'
import { readLines } from './lines'

/** Streams the stored file and keeps the ground records inside the box (and within the location-error limit). */
export async function groundRecordsInBox(gzip: Buffer, box: LatLonBox, maxLocationErrorKm: number | null): Promise<{ records: NearbyStroke[], leftOutForLocationError: number }> {
  let columns: ReturnType<typeof readLightningHeader>['columns'] | null = null
  let row = 0
  let leftOut = 0
  const records: NearbyStroke[] = []
  for await (const line of readLines(Readable.from([gzip]).pipe(createGunzip()))) {
    if (line.trim() === '') continue
    if (!columns) { columns = readLightningHeader(line).columns; continue }
    row++
    const r = parseLightningRow(splitCsvLine(line), columns)
    if (!isRecord(r) || r.type !== 'ground') continue
    if (r.latDeg < box.minLat || r.latDeg > box.maxLat || r.lonDeg < box.minLon || r.lonDeg > box.maxLon) continue
    if (maxLocationErrorKm !== null && r.locationErrorKm !== null && r.locationErrorKm > maxLocationErrorKm) { leftOut++; continue }
    records.push({ row, timeMs: r.timeMs, latDeg: r.latDeg, lonDeg: r.lonDeg, peakCurrentKa: r.peakCurrentKa, distanceKm: 0 })
  }
  return { records, leftOutForLocationError: leftOut }
}

export async function runStormClusteringCalibration(member: Member, event: H3Event, input: StormClusteringCalibrationInput) {
  const db = useDb()
  const [file] = await db.select().from(calibrationFiles)
    .where(and(eq(calibrationFiles.id, input.fileId), eq(calibrationFiles.organisationId, member.organisationId), eq(calibrationFiles.kind, 'lightning')))
  if (!file) notFound('Lightning records file')
  const summary = file.summary as LightningSummary
  const extent = summary.latitudeRange && summary.longitudeRange
    ? { minLat: summary.latitudeRange[0], maxLat: summary.latitudeRange[1], minLon: summary.longitudeRange[0], maxLon: summary.longitudeRange[1] }
    : null
  const box = input.box ?? extent
  if (!box || !(box.maxLat > box.minLat) || !(box.maxLon > box.minLon)) badRequest('The records cover no area; enter the region as a latitude/longitude box.')
  if (box.maxLat - box.minLat > 15 || box.maxLon - box.minLon > 15) badRequest('The records span more than 15° in latitude or longitude; enter a smaller region as a box (the local projection holds for regions up to about 1,500 km).')
  const periodYears = input.periodYears ?? summary.spanYears
  if (!(periodYears > 0)) badRequest('The records cover no time span; enter the record period in years.')

  const { records, leftOutForLocationError } = await groundRecordsInBox(await calibrationContent(file), box, input.maxLocationErrorKm)
  const flashes: ClusterRecord[] = input.recordsAre === 'strokes' ? groupIntoFlashes(records) : records
  // A CalibrationInputError (too few flashes, no clustering found) answers 400 with its message.
  const fit = fitStormClustering(flashes, { box, windowHours: input.windowHours, detectionEfficiency: input.detectionEfficiency, periodYears, bootstrap: input.bootstrap, seed: `${file.sha256}|${input.windowHours}` })
  const results = {
    ...fit,
    periodYears,
    periodSource: input.periodYears === null ? 'span of the records' : 'stated',
    boxSource: input.box === null ? 'extent of the records' : 'stated',
    groundRecords: records.length,
    leftOutForLocationError,
    file: { id: file.id, name: file.fileName, sha256: file.sha256, rows: file.rowCount },
  }
  return db.transaction(async (tx) => {
    const [row] = await tx.insert(calibrations).values({
      organisationId: member.organisationId, kind: 'storm_clustering', title: input.title, fileId: file.id, inputs: input, results, createdBy: member.user.id,
    }).returning()
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'create', entity: 'calibration', entityId: row!.id, after: { kind: 'storm_clustering', title: input.title, fileId: file.id, spreadKm: fit.spreadKm, flashesPerStorm: fit.flashesPerStorm, windows: fit.windows.used } }, { tx, event })
    return row!
  })
}
