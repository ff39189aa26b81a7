// Lightning-location records: the CSV format, its limits, and the check of one row.
import { readHeader, splitCsvLine } from './csv-line'

export const LIGHTNING_REQUIRED_COLUMNS = ['time', 'latitude', 'longitude', 'peak_current_ka', 'type'] as const
export const LIGHTNING_OPTIONAL_COLUMNS = ['location_error_km'] as const
export type LightningColumn = (typeof LIGHTNING_REQUIRED_COLUMNS)[number] | (typeof LIGHTNING_OPTIONAL_COLUMNS)[number]

/** Stated limits of one upload (README "Calibration"). Files are read line by line, never whole. */
export const LIGHTNING_LIMITS = {
  maxRows: 2_000_000,
  maxBytes: 256 * 1024 * 1024,
  /** Row errors listed back (all are counted). */
  maxListedErrors: 200,
  /** Largest peak-current magnitude accepted; recorded strokes above ~500 kA are unheard of. */
  maxAbsCurrentKa: 1000,
  maxLocationErrorKm: 100,
} as const

export type StrokeType = 'ground' | 'cloud'

export interface LightningRecord {
  timeMs: number
  latDeg: number
  lonDeg: number
  /** Signed: negative for negative-polarity strokes. */
  peakCurrentKa: number
  type: StrokeType
  locationErrorKm: number | null
}

export function readLightningHeader(line: string) {
  return readHeader<LightningColumn>(line, LIGHTNING_REQUIRED_COLUMNS, LIGHTNING_OPTIONAL_COLUMNS)
}

const TIME = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2})(\.\d+)?)?(Z|[+-]\d{2}:?\d{2})?$/i
const TYPES: Record<string, StrokeType> = { ground: 'ground', g: 'ground', cg: 'ground', cloud: 'cloud', c: 'cloud', ic: 'cloud' }

/** ISO 8601 date and time; without a zone it is read as UTC. NaN when invalid (incl. 30 February). */
export function parseRecordTime(text: string): number {
  const m = TIME.exec(text)
  if (!m) return Number.NaN
  const [, y, mo, d, h, mi] = m
  const iso = `${y}-${mo}-${d}T${h}:${mi}:${m[6] ?? '00'}${m[7] ?? ''}${m[8] ? m[8].toUpperCase() : 'Z'}`
  const ms = Date.parse(iso)
  const calendar = new Date(Date.UTC(Number(y), Number(mo) - 1, Number(d)))
  if (calendar.getUTCDate() !== Number(d) || calendar.getUTCMonth() !== Number(mo) - 1) return Number.NaN
  return ms
}

function number(text: string | undefined): number {
  if (text === undefined || text.trim() === '') return Number.NaN
  return Number(text)
}

/** Checks one data row; returns the record or every problem of the row. */
export function parseLightningRow(cells: readonly string[], columns: Record<LightningColumn, number>): LightningRecord | { problems: string[] } {
  const problems: string[] = []
  const get = (c: LightningColumn) => (columns[c] >= 0 ? cells[columns[c]] : undefined)
  const timeMs = parseRecordTime(get('time') ?? '')
  if (Number.isNaN(timeMs)) problems.push(`time "${get('time') ?? ''}" is not an ISO 8601 date and time (e.g. 2023-07-14T15:32:10.125Z)`)
  const latDeg = number(get('latitude'))
  if (!(latDeg >= -90 && latDeg <= 90)) problems.push(`latitude "${get('latitude') ?? ''}" must be decimal degrees between −90 and 90`)
  const lonDeg = number(get('longitude'))
  if (!(lonDeg >= -180 && lonDeg <= 180)) problems.push(`longitude "${get('longitude') ?? ''}" must be decimal degrees between −180 and 180`)
  const peakCurrentKa = number(get('peak_current_ka'))
  if (!Number.isFinite(peakCurrentKa) || peakCurrentKa === 0 || Math.abs(peakCurrentKa) > LIGHTNING_LIMITS.maxAbsCurrentKa) {
    problems.push(`peak_current_ka "${get('peak_current_ka') ?? ''}" must be a signed current in kA, not 0, at most ${LIGHTNING_LIMITS.maxAbsCurrentKa} kA in magnitude`)
  }
  const type = TYPES[(get('type') ?? '').toLowerCase()]
  if (!type) problems.push(`type "${get('type') ?? ''}" must be ground or cloud`)
  let locationErrorKm: number | null = null
  const errText = get('location_error_km')
  if (errText !== undefined && errText !== '') {
    locationErrorKm = Number(errText)
    if (!(locationErrorKm >= 0 && locationErrorKm <= LIGHTNING_LIMITS.maxLocationErrorKm)) problems.push(`location_error_km "${errText}" must be between 0 and ${LIGHTNING_LIMITS.maxLocationErrorKm} km`)
  }
  if (problems.length) return { problems }
  return { timeMs, latDeg, lonDeg, peakCurrentKa, type: type!, locationErrorKm }
}

export function isRecord(r: LightningRecord | { problems: string[] }): r is LightningRecord {
  return !('problems' in r)
}

export { splitCsvLine }
