// Reading and writing inventory files (XLSX through ExcelJS, CSV by hand): the template, the export,
// and the first step of an import — the raw cells of each sheet. No Nuxt imports: the benchmark and
// the seeder use it too.
import ExcelJS from 'exceljs'
import iconv from 'iconv-lite'
import { MAX_IMPORT_BYTES, MAX_IMPORT_ROWS, SHEET_COLUMNS, SHEET_NAMES, type SheetName } from '../../shared/inventory-layout'
import { workbookBytes } from '../utils/downloads'
import { addTableSheet, newWorkbook } from '../utils/sheets'

/** A problem with the file as a whole: nothing in it is looked at further. `status` 413 for files too large to read. */
export class ImportFileError extends Error {
  constructor(message: string, readonly status: 400 | 413 = 400) { super(message) }
}

/** Limits on what one upload may make the reader hold: checked before the work, not after. */
export const READ_LIMITS = {
  /** Sum of the uncompressed sizes of a workbook's zip entries (the XML ExcelJS would inflate). */
  maxInflatedBytes: 150 * 1024 * 1024,
  maxZipEntries: 1000,
  /** A CSV line (record) and its fields. */
  maxLineChars: 64 * 1024,
  maxColumns: 200,
}

export type RawCell = string | number | boolean | Date | { formula: string } | { error: string } | null

export interface RawRow { rowNumber: number, cells: RawCell[] }
export interface RawSheet { headers: string[], rows: RawRow[] }
export type RawWorkbook = Partial<Record<SheetName, RawSheet>>

/** How a CSV file was read: separator, text encoding and decimal mark (shown with the preview). */
export interface CsvFormat { separator: ',' | ';' | '\t', encoding: 'UTF-8' | 'UTF-16' | 'Windows-1252', decimalComma: boolean }

/** The format in words, for the preview: "CSV, semicolon-separated, decimal commas, Windows-1252 text". */
export function csvFormatInWords(f: CsvFormat): string {
  const sep = f.separator === ',' ? 'comma-separated' : f.separator === ';' ? 'semicolon-separated' : 'tab-separated'
  return `CSV, ${sep}, ${f.decimalComma ? 'decimal commas' : 'decimal points'}, ${f.encoding} text`
}

export interface ParsedFile { kind: 'xlsx' | 'csv', sheets: RawWorkbook, csv?: CsvFormat }

const ZIP_MAGIC = [0x50, 0x4b, 0x03, 0x04]
const OLE_MAGIC = [0xd0, 0xcf, 0x11, 0xe0]
const startsWith = (buf: Uint8Array, magic: number[]) => magic.every((b, i) => buf[i] === b)

/** Reads an uploaded file into raw sheets, or throws ImportFileError with a message a person can act on. */
export async function readInventoryFile(data: Buffer, fileName: string): Promise<ParsedFile> {
  if (data.length > MAX_IMPORT_BYTES) {
    throw new ImportFileError(`The file is ${(data.length / 1024 / 1024).toFixed(1)} MB; the limit is ${MAX_IMPORT_BYTES / 1024 / 1024} MB. Split it into several files.`)
  }
  if (data.length === 0) throw new ImportFileError('The file is empty.')
  const lower = fileName.toLowerCase()
  if (startsWith(data, ZIP_MAGIC)) {
    checkZipDirectory(data)
    return { kind: 'xlsx', sheets: await readXlsx(data) }
  }
  if (startsWith(data, OLE_MAGIC)) throw new ImportFileError('This is an older .xls workbook. Open it in a spreadsheet program and save it as .xlsx, then upload it again.')
  if (lower.endsWith('.xlsx')) throw new ImportFileError('The workbook could not be read: the file is damaged or is not really an .xlsx workbook. Open it in a spreadsheet program and save it again as .xlsx.')
  if (!lower.endsWith('.csv') && !lower.endsWith('.txt')) {
    throw new ImportFileError('Upload an .xlsx workbook (from the template) or a .csv file. This file is neither.')
  }
  const { text, encoding } = decodeCsvText(data)
  const { sheets, separator, decimalComma } = readCsv(text)
  return { kind: 'csv', sheets, csv: { separator, encoding, decimalComma } }
}

const UTF8_BOM = [0xef, 0xbb, 0xbf]
const UTF16LE_BOM = [0xff, 0xfe]
const UTF16BE_BOM = [0xfe, 0xff]
/** C0 controls other than tab, line feed and carriage return, and the C1 controls: never in a name. */
// eslint-disable-next-line no-control-regex -- finding control characters is the point
const CONTROL_CHARACTERS = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F-\u009F]/

/**
 * The text of a CSV file as spreadsheets write it: UTF-8 with or without a byte-order mark, UTF-16
 * with its mark ("Unicode text"), or — when the bytes are not valid UTF-8 — Windows-1252 (the
 * Western European code page, a superset of Latin-1's printable characters). Text that decodes to
 * control characters either way is refused: reading it would garble names.
 */
export function decodeCsvText(data: Uint8Array): { text: string, encoding: CsvFormat['encoding'] } {
  const refuse = () => new ImportFileError('This file is not a text CSV file in UTF-8, UTF-16 or Windows-1252 (Western European): it holds binary data or control characters that no spreadsheet writes in text. Save it from the spreadsheet as "CSV UTF-8" and upload it again.')
  let text: string
  let encoding: CsvFormat['encoding']
  if (startsWith(data, UTF16LE_BOM) || startsWith(data, UTF16BE_BOM)) {
    text = new TextDecoder(data[0] === 0xff ? 'utf-16le' : 'utf-16be').decode(data.subarray(2))
    encoding = 'UTF-16'
  } else {
    const body = startsWith(data, UTF8_BOM) ? data.subarray(3) : data
    try {
      text = new TextDecoder('utf-8', { fatal: true }).decode(body)
      encoding = 'UTF-8'
    } catch {
      // Node's TextDecoder reads 'windows-1252' as Latin-1 (0x80–0x9F as controls); iconv-lite has the code page.
      text = iconv.decode(Buffer.from(body.buffer, body.byteOffset, body.byteLength), 'windows-1252')
      if (text.includes('\uFFFD')) throw refuse() // 0x81, 0x8D, 0x8F, 0x90, 0x9D: no character in the code page
      encoding = 'Windows-1252'
    }
  }
  if (CONTROL_CHARACTERS.test(text)) throw refuse()
  return { text, encoding }
}

// ---------------------------------------------------------------- XLSX

const MB = 1024 * 1024

/**
 * Reads a zip's central directory (PKWARE APPNOTE.TXT 4.3.12 and 4.3.16) and refuses the file when
 * its entries would inflate beyond the limit, before anything is inflated. A directory that cannot
 * be found, or ZIP64 sizes (a workbook never needs them), are refused too.
 */
export function checkZipDirectory(data: Buffer): void {
  const damaged = () => new ImportFileError('The workbook could not be read: the file is damaged or is not really an .xlsx workbook. Open it in a spreadsheet program and save it again as .xlsx.')
  // End of central directory: 22 bytes plus a comment of up to 65,535 bytes, at the end of the file.
  let eocd = -1
  for (let i = data.length - 22; i >= Math.max(0, data.length - 22 - 0xffff); i--) {
    if (data.readUInt32LE(i) === 0x06054b50) { eocd = i; break }
  }
  if (eocd < 0) throw damaged()
  const entries = data.readUInt16LE(eocd + 10)
  const dirOffset = data.readUInt32LE(eocd + 16)
  if (entries > READ_LIMITS.maxZipEntries) throw new ImportFileError(`The workbook holds ${entries} parts; a workbook from the template holds a few dozen. Save it again from a spreadsheet program.`, 413)
  let at = dirOffset
  let inflated = 0
  for (let n = 0; n < entries; n++) {
    if (at + 46 > data.length || data.readUInt32LE(at) !== 0x02014b50) throw damaged()
    const size = data.readUInt32LE(at + 24)
    if (size === 0xffffffff) throw new ImportFileError(`The workbook would expand to more than ${READ_LIMITS.maxInflatedBytes / MB} MB when read, the limit. Split it into several files.`, 413)
    inflated += size
    if (inflated > READ_LIMITS.maxInflatedBytes) {
      throw new ImportFileError(`The workbook would expand to more than ${READ_LIMITS.maxInflatedBytes / MB} MB when read, the limit (it is ${(data.length / MB).toFixed(1)} MB compressed). Split it into several files, or remove formatting and unused sheets.`, 413)
    }
    at += 46 + data.readUInt16LE(at + 28) + data.readUInt16LE(at + 30) + data.readUInt16LE(at + 32)
  }
}

async function readXlsx(data: Buffer): Promise<RawWorkbook> {
  const workbook = new ExcelJS.Workbook()
  try {
    // Drop-down lists and formatting are not needed to read values; skipping them keeps large files fast.
    await workbook.xlsx.load(data as unknown as ArrayBuffer, { ignoreNodes: ['dataValidations', 'conditionalFormatting', 'hyperlinks', 'drawing', 'legacyDrawing'] } as object)
  } catch {
    throw new ImportFileError('The workbook could not be read: the file is damaged or is not really an .xlsx workbook. Open it in a spreadsheet program and save it again as .xlsx.')
  }
  const out: RawWorkbook = {}
  let total = 0
  for (const name of SHEET_NAMES) {
    const ws = workbook.worksheets.find(w => w.name.trim().toLowerCase() === name.toLowerCase())
    if (!ws) continue
    const sheet: RawSheet = { headers: [], rows: [] }
    ws.eachRow({ includeEmpty: false }, (row, rowNumber) => {
      const values = (row.values as unknown[]).slice(1).map(toRawCell)
      if (rowNumber === 1) {
        sheet.headers = values.map(v => (v === null ? '' : String(typeof v === 'object' && !(v instanceof Date) ? '' : v)).trim())
        return
      }
      if (values.every(v => v === null || v === '')) return
      total++
      if (total > MAX_IMPORT_ROWS) throw new ImportFileError(`The file has more than ${MAX_IMPORT_ROWS.toLocaleString('en-GB')} rows; the limit is ${MAX_IMPORT_ROWS.toLocaleString('en-GB')}. Split it into several files.`)
      sheet.rows.push({ rowNumber, cells: values })
    })
    out[name] = sheet
  }
  return out
}

// PostgreSQL text cannot hold U+0000; a workbook may (escaped as _x0000_), so it is dropped.
const withoutNul = (text: string) => text.replaceAll('\u0000', '')

function toRawCell(value: unknown): RawCell {
  if (value === null || value === undefined) return null
  if (typeof value === 'string') return withoutNul(value)
  if (typeof value === 'number' || typeof value === 'boolean' || value instanceof Date) return value
  if (typeof value === 'object') {
    const v = value as Record<string, unknown>
    if ('formula' in v || 'sharedFormula' in v) return { formula: String(v.formula ?? v.sharedFormula) }
    if ('error' in v) return { error: String(v.error) }
    if (Array.isArray(v.richText)) return withoutNul((v.richText as { text: string }[]).map(r => r.text).join(''))
    if ('text' in v) return withoutNul(String(v.text))
  }
  return withoutNul(String(value))
}

// ---------------------------------------------------------------- CSV

/**
 * RFC 4180 fields: `separator` between fields (comma by default), double quotes doubled inside quoted
 * fields, CRLF or LF line ends. A record longer than `maxLineChars` or with more than `maxColumns`
 * fields ends the reading.
 */
export function parseCsv(text: string, limits: { maxLineChars: number, maxColumns: number } = READ_LIMITS, separator: CsvFormat['separator'] = ','): string[][] {
  const rows: string[][] = []
  let row: string[] = []
  let field = ''
  let quoted = false
  let recordStart = 0
  const separatorName = separator === ',' ? 'commas' : separator === ';' ? 'semicolons' : 'tabs'
  const tooLong = () => new ImportFileError(`Line ${rows.length + 1} is longer than ${limits.maxLineChars / 1024} kB, the limit for one record. Is this really a CSV file of sites, tanks or structures?`)
  const tooWide = () => new ImportFileError(`Line ${rows.length + 1} has more than ${limits.maxColumns} columns, the limit; the template's sheets have about 30. Check the separator (${separatorName}) and the quotes.`)
  for (let i = 0; i < text.length; i++) {
    const c = text[i]!
    if (i - recordStart > limits.maxLineChars) throw tooLong()
    if (quoted) {
      if (c === '"') {
        if (text[i + 1] === '"') { field += '"'; i++ } else quoted = false
      } else field += c
    } else if (c === '"' && field === '') quoted = true
    else if (c === separator) {
      row.push(field); field = ''
      if (row.length >= limits.maxColumns) throw tooWide()
    } else if (c === '\n' || c === '\r') {
      if (c === '\r' && text[i + 1] === '\n') i++
      row.push(field); rows.push(row); row = []; field = ''
      recordStart = i + 1
    } else field += c
  }
  if (field !== '' || row.length > 0) { row.push(field); rows.push(row) }
  return rows
}

const KEY_COLUMNS: Record<string, SheetName> = { tank_external_id: 'Tanks', structure_external_id: 'Structures', site_external_id: 'Sites' }
const SEPARATORS: CsvFormat['separator'][] = [',', ';', '\t']

/** The header line (up to the first line end outside quotes). */
function headerLine(text: string): string {
  let quoted = false
  for (let i = 0; i < text.length && i < READ_LIMITS.maxLineChars; i++) {
    const c = text[i]!
    if (c === '"') quoted = !quoted
    else if (!quoted && (c === '\n' || c === '\r')) return text.slice(0, i)
  }
  return text.slice(0, READ_LIMITS.maxLineChars)
}

/** The separator whose split of the header names a key column of the template (comma, then semicolon, then tab). */
export function detectSeparator(text: string): CsvFormat['separator'] | null {
  const header = headerLine(text)
  for (const sep of SEPARATORS) {
    const cells = parseCsv(header, READ_LIMITS, sep)[0] ?? []
    if (cells.some(h => h.trim().toLowerCase() in KEY_COLUMNS)) return sep
  }
  return null
}

/** A number written with a decimal comma: 12,5 · -0,75 · 1.234,5 (dots then group thousands). */
const DECIMAL_COMMA = /^[-+]?(\d+|\d{1,3}(\.\d{3})+),\d+$/
const DOT_THOUSANDS = /^[-+]?\d{1,3}(\.\d{3})+$/

function readCsv(text: string): { sheets: RawWorkbook, separator: CsvFormat['separator'], decimalComma: boolean } {
  const separator = detectSeparator(text)
  if (!separator) {
    throw new ImportFileError('The CSV header row does not match the Sites, Tanks or Structures layout of the template: it needs site_external_id (Sites), tank_external_id (Tanks) or structure_external_id (Structures), with the columns separated by commas, semicolons or tabs.')
  }
  const lines = parseCsv(text, READ_LIMITS, separator)
  const headers = (lines[0] ?? []).map(h => h.trim())
  const lowered = headers.map(h => h.toLowerCase())
  const sheet: SheetName = lowered.includes('tank_external_id') ? 'Tanks' : lowered.includes('structure_external_id') ? 'Structures' : 'Sites'
  // Semicolon files come from spreadsheets set to a decimal comma: when a number column holds one,
  // the file's numbers are read that way (12,5 → 12.5, 1.234,5 → 1234.5); otherwise dots are decimals.
  const kinds = new Map(SHEET_COLUMNS[sheet].map(c => [c.header, c.kind]))
  const numeric = lowered.map(h => kinds.get(h) === 'number' || kinds.get(h) === 'integer')
  const decimalComma = separator !== ',' && lines.slice(1).some(cells => cells.some((c, k) => numeric[k] && DECIMAL_COMMA.test(c.trim())))
  const asNumber = (c: string, k: number): string => {
    if (!decimalComma || !numeric[k]) return c
    const t = c.trim()
    if (DECIMAL_COMMA.test(t)) return t.replace(/\./g, '').replace(',', '.')
    if (DOT_THOUSANDS.test(t)) return t.replace(/\./g, '')
    return c
  }
  const rows: RawRow[] = []
  for (let i = 1; i < lines.length; i++) {
    const cells = lines[i]!
    if (cells.every(c => c.trim() === '')) continue
    if (rows.length >= MAX_IMPORT_ROWS) throw new ImportFileError(`The file has more than ${MAX_IMPORT_ROWS.toLocaleString('en-GB')} rows; the limit is ${MAX_IMPORT_ROWS.toLocaleString('en-GB')}. Split it into several files.`)
    // A CSV cell starting with "=" is what a spreadsheet would run as a formula.
    rows.push({ rowNumber: i + 1, cells: cells.map((c, k) => (c.trim() === '' ? null : c.trimStart().startsWith('=') ? { formula: c.trim().slice(1) } : asNumber(c, k))) })
  }
  return { sheets: { [sheet]: { headers, rows } }, separator, decimalComma }
}

// ---------------------------------------------------------------- writing

interface DataValidationsHolder { dataValidations: { add: (range: string, v: object) => void } }

function columnLetter(index: number): string {
  let n = index + 1
  let s = ''
  while (n > 0) { const r = (n - 1) % 26; s = String.fromCharCode(65 + r) + s; n = Math.floor((n - 1) / 26) }
  return s
}

function addSheet(workbook: ExcelJS.Workbook, name: SheetName, rows: Record<string, unknown>[]) {
  const columns = SHEET_COLUMNS[name]
  // The import layout's headers as they are (units in the names, e.g. height_m); the note says the unit.
  const ws = addTableSheet(workbook, name, columns.map(c => ({ header: c.header, key: c.header, unit: c.unit ?? '', note: `${c.note} ${c.required ? 'Required.' : 'Optional.'}`, width: c.width ?? 14 })),
    rows.map(r => Object.fromEntries(columns.map(c => [c.header, cellForWriting(r[c.header])]))), { filter: false })
  // Drop-down lists for the closed sets, over every row an import may hold.
  const lastRow = MAX_IMPORT_ROWS + 1
  columns.forEach((c, i) => {
    const list = c.kind === 'enum' ? c.values : c.kind === 'boolean' ? ['yes', 'no'] : null
    if (!list) return
    const col = columnLetter(i);
    (ws as unknown as DataValidationsHolder).dataValidations.add(`${col}2:${col}${lastRow}`, {
      type: 'list', allowBlank: !c.required, formulae: [`"${list.join(',')}"`],
      showErrorMessage: true, errorTitle: c.header, error: `Choose one of: ${list.join(', ')}`,
    })
  })
}

/** Yes/no as the import reads it; text is made formula-safe by the sheet writer (OWASP CSV-injection guidance). */
function cellForWriting(value: unknown): string | number | null {
  if (value === null || value === undefined) return null
  if (typeof value === 'number') return Number.isFinite(value) ? value : null
  if (typeof value === 'boolean') return value ? 'yes' : 'no'
  return String(value)
}

export type SheetRows = Record<SheetName, Record<string, unknown>[]>

/** A workbook in the template layout; with no rows it is the template itself. */
export async function writeInventoryWorkbook(rows: SheetRows = { Sites: [], Tanks: [], Structures: [] }): Promise<Buffer> {
  const workbook = newWorkbook()
  workbook.created = new Date(0)
  const readMe = workbook.addWorksheet('Read me')
  readMe.getColumn(1).width = 110
  const lines = [
    'Stormledger inventory workbook',
    '',
    'Fill the sheets Sites, Tanks and Structures: one record per row, under the header row. Keep the header names; hover over a header for its meaning and unit.',
    'Units are in the column names: _m = metres, _deg = decimal degrees, _per_km2_yr = flashes per km² per year, _days_per_yr, _ka = kiloamperes, _c = °C. Money is in your organisation\'s currency.',
    'Enter numbers as numbers (no units in the cell) and values, not formulas. yes/no columns and closed lists offer a drop-down.',
    'Rows are matched by site_external_id (Sites), site_external_id + tank_external_id (Tanks) and site_external_id + structure_external_id (Structures): importing the same file again changes nothing. Rows not in the file are kept.',
    `Limits: ${MAX_IMPORT_BYTES / 1024 / 1024} MB per file and ${MAX_IMPORT_ROWS.toLocaleString('en-GB')} rows in all sheets together.`,
    'A site has either flash_density_per_km2_yr or thunderstorm_days_per_yr, never both.',
  ]
  lines.forEach((l, i) => { readMe.getCell(i + 1, 1).value = l })
  readMe.getCell(1, 1).font = { bold: true, size: 14 }
  for (const name of SHEET_NAMES) addSheet(workbook, name, rows[name])
  return workbookBytes(workbook)
}
