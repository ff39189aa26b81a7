// Lightning records for storms, in the calibration CSV format and read by the calibration's own
// reader (shared/calibration/lightning-records.ts): a batch is checked whole, line by line, and
// taken only when every line is valid.
import { createHash } from 'node:crypto'
import { isRecord, parseLightningRow, readLightningHeader, splitCsvLine, type LightningRecord } from '../../shared/calibration'
import { LineTooLongError, readLines } from '../calibration/lines'

/** Limits of one storm batch (feed post or upload). */
export const STORM_BATCH_LIMITS = { maxBytes: 16 * 1024 * 1024, maxRecords: 200_000, maxListedErrors: 200 } as const

export interface StormRecord extends LightningRecord { recordKey: string, line: number }
export interface LineProblem { line: number, message: string }

export type StormParse =
  | { ok: true, records: StormRecord[], sha256: string, bytes: number }
  | { ok: false, message: string, lineErrors: LineProblem[], errorCount: number }

/**
 * The record's identity: SHA-256 of its time (ms), position (1e-6°), current (0.1 kA), type and
 * location error as the provider gave them. Posting the same record again finds the same key.
 */
export function recordKey(r: LightningRecord): string {
  const text = [r.timeMs, r.latDeg.toFixed(6), r.lonDeg.toFixed(6), r.peakCurrentKa.toFixed(1), r.type, r.locationErrorKm ?? ''].join('|')
  return createHash('sha256').update(text).digest('hex')
}

export async function parseStormBatch(body: AsyncIterable<Buffer>): Promise<StormParse> {
  const hash = createHash('sha256')
  let bytes = 0
  let tooLarge = false
  async function* counted(): AsyncGenerator<Buffer> {
    for await (const chunk of body) {
      bytes += chunk.length
      if (bytes > STORM_BATCH_LIMITS.maxBytes) { tooLarge = true; return }
      hash.update(chunk)
      yield chunk
    }
  }
  const records: StormRecord[] = []
  const lineErrors: LineProblem[] = []
  let errorCount = 0
  let columns: ReturnType<typeof readLightningHeader>['columns'] | null = null
  let lineNo = 0
  const fail = (message: string): StormParse => ({ ok: false, message, lineErrors, errorCount })
  try {
    for await (const line of readLines(counted())) {
      lineNo++
      if (line.trim() === '') continue
      if (!columns) {
        const header = readLightningHeader(line)
        if (header.problems.length) {
          errorCount++
          lineErrors.push({ line: lineNo, message: `The columns are not right. ${header.problems.join(' ')}` })
          return fail(`Line ${lineNo}: the columns are not right. ${header.problems.join(' ')}`)
        }
        columns = header.columns
        continue
      }
      if (records.length + errorCount >= STORM_BATCH_LIMITS.maxRecords) return fail(`The batch has more than ${STORM_BATCH_LIMITS.maxRecords.toLocaleString('en-GB')} records, the most one batch may hold. Post it in parts.`)
      const r = parseLightningRow(splitCsvLine(line), columns)
      if (!isRecord(r)) {
        errorCount++
        if (lineErrors.length < STORM_BATCH_LIMITS.maxListedErrors) lineErrors.push({ line: lineNo, message: r.problems.join('; ') })
        continue
      }
      records.push({ ...r, recordKey: recordKey(r), line: lineNo })
    }
  } catch (error) {
    if (error instanceof LineTooLongError) return fail(error.message)
    throw error
  }
  if (tooLarge) return fail(`The batch is larger than ${STORM_BATCH_LIMITS.maxBytes / 1024 / 1024} MB. Post it in parts.`)
  if (!columns) return fail('The batch is empty. The first line must name the columns time, latitude, longitude, peak_current_ka, type (optionally location_error_km).')
  if (errorCount) {
    const first = lineErrors[0]!
    return fail(`${errorCount.toLocaleString('en-GB')} of ${(errorCount + records.length).toLocaleString('en-GB')} records have errors (first: line ${first.line}: ${first.message}); nothing was stored.`)
  }
  if (records.length === 0) return fail('The batch has a header line but no records.')
  return { ok: true, records, sha256: hash.digest('hex'), bytes }
}
