// Impulse test records as CSV: one application per line, in the order applied.
import { readHeader, splitCsvLine } from './csv-line'
import { CalibrationInputError } from './errors'
import type { ImpulseApplication } from './impulse'

export const IMPULSE_COLUMNS = ['level_kv', 'spark'] as const
export const IMPULSE_LIMITS = { maxRows: 10_000, maxBytes: 1024 * 1024 } as const

const SPARK: Record<string, boolean> = { 1: true, 0: false, yes: true, no: false, y: true, n: false, true: true, false: false, spark: true, 'no spark': false, none: false }

export function parseSparkFlag(text: string): boolean | undefined {
  return SPARK[text.trim().toLowerCase()]
}

export interface RowError { row: number, message: string }

/** Parses the whole (small) file; throws with every row error, or returns the series in order. */
export function parseImpulseCsv(text: string): ImpulseApplication[] {
  if (text.length > IMPULSE_LIMITS.maxBytes) throw new CalibrationInputError(`The file is larger than ${IMPULSE_LIMITS.maxBytes / 1024 / 1024} MB; an impulse series has at most ${IMPULSE_LIMITS.maxRows} applications.`)
  const lines = text.split(/\r?\n/)
  while (lines.length && lines.at(-1)!.trim() === '') lines.pop()
  if (lines.length === 0) throw new CalibrationInputError('The file is empty. The first line must name the columns level_kv, spark.')
  const { columns, problems } = readHeader(lines[0]!, IMPULSE_COLUMNS)
  if (problems.length) throw new CalibrationInputError(problems)
  const series: ImpulseApplication[] = []
  const errors: RowError[] = []
  for (let i = 1; i < lines.length; i++) {
    const line = lines[i]!
    if (line.trim() === '') continue
    const cells = splitCsvLine(line)
    const levelKv = Number(cells[columns.level_kv])
    const spark = parseSparkFlag(cells[columns.spark] ?? '')
    const rowProblems: string[] = []
    if (!(levelKv > 0) || cells[columns.level_kv] === '') rowProblems.push(`level_kv "${cells[columns.level_kv] ?? ''}" must be a voltage above 0 kV`)
    if (spark === undefined) rowProblems.push(`spark "${cells[columns.spark] ?? ''}" must be yes or no (or 1 / 0)`)
    if (rowProblems.length) errors.push({ row: i + 1, message: rowProblems.join('; ') })
    else series.push({ levelKv, spark: spark! })
  }
  if (errors.length) throw new CalibrationInputError(errors.slice(0, 50).map(e => `Line ${e.row}: ${e.message}.`))
  if (series.length === 0) throw new CalibrationInputError('The file holds no applications: the series is empty.')
  if (series.length > IMPULSE_LIMITS.maxRows) throw new CalibrationInputError(`The series has ${series.length} applications; at most ${IMPULSE_LIMITS.maxRows} are accepted.`)
  return series
}

/** The series written back as CSV (kept as the source of a series entered by hand). */
export function impulseCsv(series: readonly ImpulseApplication[]): string {
  return ['level_kv,spark', ...series.map(a => `${a.levelKv},${a.spark ? 'yes' : 'no'}`)].join('\n') + '\n'
}
