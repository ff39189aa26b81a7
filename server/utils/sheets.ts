// The one workbook and CSV writer of every export (results, financial, storm, capital plan,
// inventory): a table sheet from a column list {header, key, unit, numFmt} and rows, a caution and
// provenance sheet, formula-safe text, CSV from the same column list, and the download itself.
// Number formats are chosen here once (methodology and README "Exports"):
// - frequencies (/yr) and probabilities: fixed decimals, as many as the column's smallest non-zero
//   value needs for three significant digits (2 to 8), never 0.000E+00;
// - money: whole units with thousands separators, the currency code in the header;
// - shares on [0, 1]: per cent with one decimal ('0.0%');
// - counts: whole numbers.
// No Nuxt imports beyond h3: the seeder and the benchmarks write workbooks through it too.
import ExcelJS from 'exceljs'
import type { H3Event } from 'h3'
import { CAUTION_FULL } from '../../shared/caution'
import { neutraliseFormula, toCsv } from '../../shared/csv'
import { setDownloadHeaders, workbookBytes } from './downloads'

export type CellValue = string | number | boolean | Date | null | undefined

/** One column of a table sheet (or CSV): the header people read, with its unit, and the row key. */
export interface SheetColumn {
  /** The header as written, its unit included: "Average annual loss (AAL), EUR/yr". */
  header: string
  /** Key of the row object that holds the value. */
  key: string
  /** The unit alone ('' for names and labels): written as the header's note, so the unit stays when a header is cut. */
  unit: string
  /** Excel number format of the column; `NUMBER_FORMATS` or `decimalsFor(values)`. */
  numFmt?: string
  width?: number
  /** Meaning of the column, shown with the unit on hovering the header. */
  note?: string
}

export const NUMBER_FORMATS = {
  money: '#,##0',
  /** Shares and probabilities of years on [0, 1]. */
  share: '0.0%',
  count: '0',
  coordinate: '0.0000',
  metres: '0',
  /** Return periods and other whole years. */
  years: '0',
} as const

/**
 * A fixed-decimal format for frequencies (/yr) and probabilities: enough decimals for three
 * significant digits of the smallest non-zero value (between 2 and 8 decimals).
 */
export function decimalsFor(values: Iterable<number | null | undefined>): string {
  let smallest = Infinity
  for (const v of values) if (typeof v === 'number' && Number.isFinite(v) && v !== 0 && Math.abs(v) < smallest) smallest = Math.abs(v)
  const decimals = smallest === Infinity ? 2 : Math.min(8, Math.max(2, 2 - Math.floor(Math.log10(smallest))))
  return `0.${'0'.repeat(decimals)}`
}

/** A cell as written: text that a spreadsheet would run as a formula is prefixed (OWASP CSV-injection guidance). */
export function safeCell(value: CellValue): string | number | boolean | Date | null {
  if (value === null || value === undefined) return null
  if (typeof value === 'number') return Number.isFinite(value) ? value : null
  if (typeof value === 'string') return neutraliseFormula(value)
  return value
}

/** A new workbook by Stormledger. */
export function newWorkbook(): ExcelJS.Workbook {
  const wb = new ExcelJS.Workbook()
  wb.creator = 'Stormledger'
  return wb
}

/**
 * A table sheet: bold header row (each header's note gives the unit and meaning), frozen, with a
 * filter; each column's number format; every text cell formula-safe.
 */
export function addTableSheet(wb: ExcelJS.Workbook, name: string, columns: SheetColumn[], rows: Record<string, CellValue>[], options: { filter?: boolean } = {}): ExcelJS.Worksheet {
  const ws = wb.addWorksheet(name, { views: [{ state: 'frozen', ySplit: 1 }] })
  ws.columns = columns.map(c => ({ header: c.header, key: c.key, width: c.width ?? Math.min(40, Math.max(12, c.header.length + 2)), style: c.numFmt ? { numFmt: c.numFmt } : {} }))
  const header = ws.getRow(1)
  header.font = { bold: true }
  columns.forEach((c, i) => {
    const note = [c.note, c.unit ? `Unit: ${c.unit}.` : ''].filter(Boolean).join(' ')
    if (note) header.getCell(i + 1).note = note
  })
  for (const r of rows) ws.addRow(columns.map(c => safeCell(r[c.key])))
  if (options.filter !== false && columns.length > 0) ws.autoFilter = { from: { row: 1, column: 1 }, to: { row: 1, column: columns.length } }
  return ws
}

/** A row of a caution / provenance sheet: a label, its value(s) and, for numbers, their format. */
export interface SummaryRow { cells: CellValue[], numFmt?: string, bold?: boolean }
export const blankRow: SummaryRow = { cells: [] }
export const headingRow = (text: string): SummaryRow => ({ cells: [text], bold: true })
export const valueRow = (label: string, value: CellValue, numFmt?: string): SummaryRow => ({ cells: [label, value], numFmt })

/**
 * The caution and provenance sheet that opens every export: the title (row 1, when given), the
 * caution (next row, column B), then the rows given (headline figures, provenance). Text cells are
 * formula-safe; `numFmt` applies to the numbers of its row.
 */
export function addCautionSheet(wb: ExcelJS.Workbook, o: { name?: string, title?: string, caution?: string, rows: SummaryRow[], widths?: number[] }): ExcelJS.Worksheet {
  const ws = wb.addWorksheet(o.name ?? 'Summary')
  const widths = o.widths ?? [46, 70]
  widths.forEach((w, i) => { ws.getColumn(i + 1).width = w })
  const top: SummaryRow[] = o.title ? [{ cells: [o.title] }] : []
  const rows: SummaryRow[] = [...top, { cells: ['Caution', o.caution ?? CAUTION_FULL] }, ...o.rows]
  rows.forEach((r, i) => {
    const row = ws.getRow(i + 1)
    r.cells.forEach((v, j) => {
      const cell = row.getCell(j + 1)
      cell.value = safeCell(v)
      if (r.numFmt && typeof v === 'number') cell.numFmt = r.numFmt
    })
    if (r.bold) row.font = { bold: true }
  })
  if (o.title) ws.getCell(1, 1).font = { bold: true, size: 14 }
  ws.getCell(top.length + 1, 2).alignment = { wrapText: true, vertical: 'top' }
  return ws
}

/** CSV of a table from the same column list (headers as in the workbook, formula-safe text). */
export function tableCsv(columns: SheetColumn[], rows: Record<string, CellValue>[]): string {
  const plain = (v: CellValue): string | number | null => (v instanceof Date ? v.toISOString() : typeof v === 'boolean' ? (v ? 'yes' : 'no') : v ?? null)
  return toCsv({ headers: columns.map(c => c.header), rows: rows.map(r => columns.map(c => plain(r[c.key]))) })
}

/** Writes the workbook and marks the answer as its download (`setDownloadHeaders`). */
export async function sendWorkbook(event: H3Event, wb: ExcelJS.Workbook | Buffer, fileName: string): Promise<Buffer> {
  const bytes = Buffer.isBuffer(wb) ? wb : await workbookBytes(wb)
  setDownloadHeaders(event, fileName, 'xlsx')
  return bytes
}

/** Marks the answer as a CSV download of the table and returns its text. */
export function sendCsv(event: H3Event, fileName: string, columns: SheetColumn[], rows: Record<string, CellValue>[]): string {
  setDownloadHeaders(event, fileName, 'csv')
  return tableCsv(columns, rows)
}
