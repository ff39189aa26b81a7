// Lightning-location files: checked while they stream in (kept gzip-compressed only when every row
// is valid), and read again, streaming, to collect the records near chosen sites.
import { createHash } from 'node:crypto'
import { Readable } from 'node:stream'
import { createGunzip, createGzip } from 'node:zlib'
import {
  boundingBox, FLASH_GROUPING, haversineKm, insideBox, isRecord, LIGHTNING_LIMITS, parseLightningRow, readLightningHeader,
  splitCsvLine, type NearbyStroke,
} from '../../shared/calibration'
import { LineTooLongError, readLines } from './lines'

export interface LightningSummary {
  rows: number
  groundRecords: number
  cloudRecords: number
  negativeGround: number
  positiveGround: number
  withLocationError: number
  firstTime: string | null
  lastTime: string | null
  /** Span between the first and last record, in years of 365.25 days. */
  spanYears: number
  latitudeRange: [number, number] | null
  longitudeRange: [number, number] | null
}

export interface RowProblem { line: number, message: string }

export type IngestResult =
  | { ok: true, gzip: Buffer, sha256: string, bytes: number, summary: LightningSummary }
  | { ok: false, message: string, rowErrors: RowProblem[], errorCount: number, rows: number }

const YEAR_MS = 365.25 * 86400e3

/**
 * Reads an upload once: counts bytes against the limit, hashes it, compresses it, and checks every
 * row. Nothing is returned for storage unless the whole file is valid (all-or-nothing).
 */
export async function ingestLightningFile(body: AsyncIterable<Buffer>): Promise<IngestResult> {
  const hash = createHash('sha256')
  const gzip = createGzip()
  const compressed: Buffer[] = []
  gzip.on('data', (c: Buffer) => compressed.push(c))
  const gzipDone = new Promise<void>((resolve, reject) => { gzip.on('end', resolve); gzip.on('error', reject) })
  let bytes = 0
  let tooLarge = false
  async function* counted(): AsyncGenerator<Buffer> {
    for await (const chunk of body) {
      bytes += chunk.length
      if (bytes > LIGHTNING_LIMITS.maxBytes) { tooLarge = true; return }
      hash.update(chunk)
      if (!gzip.write(chunk)) await new Promise(r => gzip.once('drain', r))
      yield chunk
    }
  }

  const s: LightningSummary = { rows: 0, groundRecords: 0, cloudRecords: 0, negativeGround: 0, positiveGround: 0, withLocationError: 0, firstTime: null, lastTime: null, spanYears: 0, latitudeRange: null, longitudeRange: null }
  const rowErrors: RowProblem[] = []
  let errorCount = 0
  let columns: ReturnType<typeof readLightningHeader>['columns'] | null = null
  let lineNo = 0
  let first = Infinity, last = -Infinity, minLat = Infinity, maxLat = -Infinity, minLon = Infinity, maxLon = -Infinity
  const fail = (message: string): IngestResult => { gzip.destroy(); return { ok: false, message, rowErrors, errorCount, rows: s.rows } }

  try {
    for await (const line of readLines(counted())) {
      lineNo++
      if (!columns) {
        if (line.trim() === '') continue
        const header = readLightningHeader(line)
        if (header.problems.length) return fail(`The file's columns are not right. ${header.problems.join(' ')}`)
        columns = header.columns
        continue
      }
      if (line.trim() === '') continue
      s.rows++
      if (s.rows > LIGHTNING_LIMITS.maxRows) return fail(`The file has more than ${LIGHTNING_LIMITS.maxRows.toLocaleString('en-GB')} records, the most one upload may hold. Split it by period or region.`)
      const r = parseLightningRow(splitCsvLine(line), columns)
      if (!isRecord(r)) {
        errorCount++
        if (rowErrors.length < LIGHTNING_LIMITS.maxListedErrors) rowErrors.push({ line: lineNo, message: r.problems.join('; ') })
        continue
      }
      if (r.type === 'ground') {
        s.groundRecords++
        if (r.peakCurrentKa < 0) s.negativeGround++
        else s.positiveGround++
      } else s.cloudRecords++
      if (r.locationErrorKm !== null) s.withLocationError++
      if (r.timeMs < first) first = r.timeMs
      if (r.timeMs > last) last = r.timeMs
      if (r.latDeg < minLat) minLat = r.latDeg
      if (r.latDeg > maxLat) maxLat = r.latDeg
      if (r.lonDeg < minLon) minLon = r.lonDeg
      if (r.lonDeg > maxLon) maxLon = r.lonDeg
    }
  } catch (error) {
    // A line over the limit (a header of 10⁶ columns, a binary file) ends the reading there.
    if (error instanceof LineTooLongError) return fail(error.message)
    throw error
  }
  if (tooLarge) return fail(`The file is larger than ${LIGHTNING_LIMITS.maxBytes / 1024 / 1024} MB, the most one upload may be. Split it by period or region.`)
  if (!columns) return fail('The file is empty. The first line must name the columns time, latitude, longitude, peak_current_ka, type (optionally location_error_km).')
  if (errorCount) return fail(`${errorCount.toLocaleString('en-GB')} of ${s.rows.toLocaleString('en-GB')} records have errors; nothing was stored. Correct them and upload again.`)
  if (s.rows === 0) return fail('The file has a header line but no records.')
  gzip.end()
  await gzipDone
  s.firstTime = new Date(first).toISOString()
  s.lastTime = new Date(last).toISOString()
  s.spanYears = (last - first) / YEAR_MS
  s.latitudeRange = [minLat, maxLat]
  s.longitudeRange = [minLon, maxLon]
  return { ok: true, gzip: Buffer.concat(compressed), sha256: hash.digest('hex'), bytes, summary: s }
}

export interface SitePoint { id: string, latDeg: number, lonDeg: number }

export interface ScanOptions {
  radiusKm: number
  /** Strokes out to this much beyond the radius are kept so flashes can be formed whole. */
  marginKm: number
  maxLocationErrorKm: number | null
}

/**
 * Streams a stored file again and keeps, per site, the ground records within radius + margin.
 * Records with a stated location error above the limit are left out and counted.
 */
export async function collectNearSites(gzip: Buffer, sites: readonly SitePoint[], options: ScanOptions): Promise<{ perSite: Map<string, NearbyStroke[]>, leftOutForLocationError: number }> {
  const reach = options.radiusKm + options.marginKm
  const boxes = sites.map(site => ({ site, box: boundingBox(site.latDeg, site.lonDeg, reach) }))
  const perSite = new Map<string, NearbyStroke[]>(sites.map(site => [site.id, []]))
  let columns: ReturnType<typeof readLightningHeader>['columns'] | null = null
  let row = 0
  let leftOut = 0
  const stream = Readable.from([gzip]).pipe(createGunzip())
  for await (const line of readLines(stream)) {
    if (line.trim() === '') continue
    if (!columns) { columns = readLightningHeader(line).columns; continue }
    row++
    const r = parseLightningRow(splitCsvLine(line), columns)
    if (!isRecord(r) || r.type !== 'ground') continue
    let near = false
    for (const { site, box } of boxes) {
      if (!insideBox(box, r.latDeg, r.lonDeg)) continue
      const distanceKm = haversineKm(site.latDeg, site.lonDeg, r.latDeg, r.lonDeg)
      if (distanceKm > reach) continue
      if (!near && options.maxLocationErrorKm !== null && r.locationErrorKm !== null && r.locationErrorKm > options.maxLocationErrorKm) { leftOut++; break }
      near = true
      perSite.get(site.id)!.push({ row, timeMs: r.timeMs, latDeg: r.latDeg, lonDeg: r.lonDeg, peakCurrentKa: r.peakCurrentKa, distanceKm })
    }
  }
  return { perSite, leftOutForLocationError: leftOut }
}

export const GROUPING_MARGIN_KM = FLASH_GROUPING.maxDistanceKm

/** The stored file as it was uploaded. */
export function storedFileStream(gzip: Buffer): Readable {
  return Readable.from([gzip]).pipe(createGunzip())
}
