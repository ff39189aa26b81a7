// Second step of an import: each raw row → a validated record (the same zod schemas as the forms),
// or row-level errors naming the sheet, row, column and what to do.
import type { z } from 'zod'
import { COMPONENT_CLASSES, CONTENTS_LABELS, GROUNDING_LABELS, MATERIAL_LABELS, STRUCTURE_LABELS, siteSchema, structureSchema, tankSchema, type ComponentClass, type SiteRecord, type StructureRecord, type TankRecord } from '../../shared/schemas/inventory'
import { inWords } from '../../shared/schemas/messages'
import { SHEET_COLUMNS, SHEET_NAMES, type ColumnSpec, type SheetName } from '../../shared/inventory-layout'
import type { CsvFormat, ParsedFile, RawCell } from './workbook'

export interface RowError { sheet: SheetName | 'File', row: number, column: string, message: string }

export interface SiteRow { row: number, record: SiteRecord }
export interface TankRow { row: number, siteExternalId: string, record: TankRecord }
export interface StructureRow { row: number, siteExternalId: string, record: StructureRecord }

export interface ValidatedFile {
  sites: SiteRow[]
  tanks: TankRow[]
  structures: StructureRow[]
  /** Sheets the file holds (a CSV holds one). */
  sheets: SheetName[]
  rowCount: number
  errors: RowError[]
  /** How a CSV file was read (absent for workbooks). */
  csv?: CsvFormat
}

const UNIT_WORDS = new Set(['ft', 'feet', 'foot', 'in', 'inch', 'inches', 'cm', 'mm', 'km', 'mi', 'mile', 'miles', 'yd', 'f', 'degf', 'fahrenheit', 'k', 'a', 'ka', 'm', 'deg', 'rad', 'mi2', 'ft2', 'pct', 'percent', 'usd', 'eur', 'gbp'])
const LABEL_TO_VALUE: Record<string, string> = Object.fromEntries(
  [MATERIAL_LABELS, CONTENTS_LABELS, STRUCTURE_LABELS, GROUNDING_LABELS].flatMap(labels => Object.entries(labels).map(([v, l]) => [l.toLowerCase(), v])),
)
const NUMBER = /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/
const THOUSANDS = /^[-+]?\d{1,3}(,\d{3})+(\.\d+)?$/
const NUMBER_WITH_UNIT = /^[-+]?(\d+[.,]?\d*|\.\d+)\s*[a-zA-Z°²"'/%$€£]/
const FORMULA_NEUTRALISED = /^'[=+\-@\t\r]/

type Converted = { ok: true, value: unknown } | { ok: false, message: string }

function describeKind(spec: ColumnSpec): string {
  if (spec.kind === 'enum') return `one of: ${spec.values!.join(', ')}`
  if (spec.kind === 'boolean') return 'yes or no'
  if (spec.kind === 'integer') return 'a whole number'
  if (spec.kind === 'number') return spec.unit ? `a number in ${spec.unit}` : 'a number'
  return 'text'
}

/** One cell → the value of its kind; formulas, error cells and text in number cells are refused. */
export function convertCell(cell: RawCell, spec: ColumnSpec): Converted {
  if (cell === null || (typeof cell === 'string' && cell.trim() === '')) {
    if (spec.required) return { ok: false, message: `Empty; enter ${describeKind(spec)}.` }
    return { ok: true, value: spec.kind === 'text' ? '' : null }
  }
  if (typeof cell === 'object' && !(cell instanceof Date)) {
    if ('formula' in cell) return { ok: false, message: `The cell holds a formula (=${cell.formula.slice(0, 40)}); formulas are not imported. Enter the value itself.` }
    return { ok: false, message: `The cell shows a spreadsheet error (${cell.error}); enter ${describeKind(spec)}.` }
  }
  if (cell instanceof Date) return { ok: false, message: `The cell holds a date; enter ${describeKind(spec)}.` }
  switch (spec.kind) {
    case 'text': {
      const text = String(cell).trim()
      return { ok: true, value: FORMULA_NEUTRALISED.test(text) ? text.slice(1) : text }
    }
    case 'number':
    case 'integer': {
      let n: number
      if (typeof cell === 'number') n = cell
      else if (typeof cell === 'boolean') return { ok: false, message: `Enter ${describeKind(spec)}, not ${cell ? 'TRUE' : 'FALSE'}.` }
      else {
        const text = cell.trim()
        if (NUMBER.test(text)) n = Number(text)
        else if (THOUSANDS.test(text)) n = Number(text.replace(/,/g, ''))
        else if (NUMBER_WITH_UNIT.test(text)) return { ok: false, message: `Text in a number cell ("${text.slice(0, 30)}"): enter the number alone, in ${spec.unit ?? 'the column\'s unit'}${spec.unit ? '' : ''} — convert it first if it is in another unit.` }
        else return { ok: false, message: `Text in a number cell ("${text.slice(0, 30)}"): enter ${describeKind(spec)}.` }
      }
      if (!Number.isFinite(n)) return { ok: false, message: `Enter ${describeKind(spec)}.` }
      if (spec.kind === 'integer' && !Number.isInteger(n)) return { ok: false, message: `Enter a whole number (${n} is not one).` }
      return { ok: true, value: n }
    }
    case 'boolean': {
      if (typeof cell === 'boolean') return { ok: true, value: cell }
      const t = String(cell).trim().toLowerCase()
      if (['yes', 'y', 'true', '1'].includes(t)) return { ok: true, value: true }
      if (['no', 'n', 'false', '0'].includes(t)) return { ok: true, value: false }
      return { ok: false, message: `"${String(cell).slice(0, 30)}" is not yes or no.` }
    }
    case 'enum': {
      const raw = String(cell).trim()
      const t = raw.toLowerCase()
      const code = t.replace(/[\s-]+/g, '_')
      if (spec.values!.includes(code)) return { ok: true, value: code }
      const fromLabel = LABEL_TO_VALUE[t]
      if (fromLabel && spec.values!.includes(fromLabel)) return { ok: true, value: fromLabel }
      return { ok: false, message: `"${raw.slice(0, 30)}" is not one of: ${spec.values!.join(', ')}.` }
    }
  }
}

/** Header problems: missing columns, unknown columns, columns in another unit, repeated columns. */
function checkHeaders(sheet: SheetName, headers: string[], errors: RowError[]): Map<string, number> | null {
  const specs = SHEET_COLUMNS[sheet]
  const known = new Map(specs.map(s => [s.header, s]))
  const index = new Map<string, number>()
  let fatal = false
  headers.forEach((raw, i) => {
    const h = raw.trim().toLowerCase()
    if (h === '') return
    if (index.has(h)) { errors.push({ sheet, row: 1, column: h, message: `The column ${h} appears twice; keep one.` }); fatal = true; return }
    if (known.has(h)) { index.set(h, i); return }
    const cut = h.lastIndexOf('_')
    const base = cut > 0 ? h.slice(0, cut) : h
    const unit = cut > 0 ? h.slice(cut + 1) : ''
    const sameQuantity = specs.find(s => s.unit && s.header.startsWith(`${base}_`))
    if (sameQuantity && UNIT_WORDS.has(unit)) {
      errors.push({ sheet, row: 1, column: raw, message: `Wrong unit: ${sheet} takes ${sameQuantity.header} in ${sameQuantity.unit}. Convert the values and name the column ${sameQuantity.header}.` })
    } else {
      errors.push({ sheet, row: 1, column: raw, message: `Unknown column "${raw}". The ${sheet} sheet takes: ${specs.map(s => s.header).join(', ')}.` })
    }
    fatal = true
  })
  for (const spec of specs) {
    if (!index.has(spec.header)) {
      errors.push({ sheet, row: 1, column: spec.header, message: `The column ${spec.header} is missing. Use the header row of the template.` })
      fatal = true
    }
  }
  return fatal ? null : index
}

/** Converts every cell of a row; returns the field values, or pushes errors and returns null. */
function convertRow(sheet: SheetName, rowNumber: number, cells: RawCell[], index: Map<string, number>, errors: RowError[]): Record<string, unknown> | null {
  const values: Record<string, unknown> = {}
  let ok = true
  for (const spec of SHEET_COLUMNS[sheet]) {
    const c = convertCell(cells[index.get(spec.header)!] ?? null, spec)
    if (c.ok) values[spec.field] = c.value
    else { ok = false; errors.push({ sheet, row: rowNumber, column: spec.header, message: c.message }) }
  }
  return ok ? values : null
}

function pushZodErrors(sheet: SheetName, row: number, error: z.ZodError, columnFor: (path: PropertyKey[]) => string, errors: RowError[]) {
  for (const issue of error.issues) errors.push({ sheet, row, column: columnFor(issue.path), message: issue.message })
}

const headerByField = (sheet: SheetName) => new Map(SHEET_COLUMNS[sheet].map(s => [s.field, s.header]))

/** Every row of every sheet the file holds → records, with all the row-level errors found. */
export function validateFile(file: ParsedFile): ValidatedFile {
  const out: ValidatedFile = { sites: [], tanks: [], structures: [], sheets: [], rowCount: 0, errors: [], ...(file.csv ? { csv: file.csv } : {}) }
  if (file.kind === 'xlsx') {
    for (const name of SHEET_NAMES) {
      if (!file.sheets[name]) out.errors.push({ sheet: name, row: 0, column: '', message: `The workbook has no sheet named ${name}. Start from the template; leave a sheet empty (header row only) if you have nothing for it.` })
    }
  }
  for (const sheet of SHEET_NAMES) {
    const raw = file.sheets[sheet]
    if (!raw) continue
    out.sheets.push(sheet)
    out.rowCount += raw.rows.length
    const index = checkHeaders(sheet, raw.headers, out.errors)
    if (!index) continue
    const fields = headerByField(sheet)
    for (const r of raw.rows) {
      const values = convertRow(sheet, r.rowNumber, r.cells, index, out.errors)
      if (!values) continue
      if (sheet === 'Sites') {
        const parsed = siteSchema.safeParse(values, { error: inWords })
        if (parsed.success) out.sites.push({ row: r.rowNumber, record: parsed.data })
        else pushZodErrors(sheet, r.rowNumber, parsed.error, p => fields.get(String(p[0])) ?? String(p[0]), out.errors)
      } else if (sheet === 'Tanks') {
        const { components, problems } = collectComponents(values)
        for (const p of problems) out.errors.push({ sheet, row: r.rowNumber, column: p.column, message: p.message })
        if (problems.length > 0) continue
        const parsed = tankSchema.safeParse({ ...values, components }, { error: inWords })
        if (parsed.success) out.tanks.push({ row: r.rowNumber, siteExternalId: String(values.siteExternalId), record: parsed.data })
        else {
          pushZodErrors(sheet, r.rowNumber, parsed.error, (p) => {
            if (p[0] === 'components' && typeof p[1] === 'number') {
              const cls = components[p[1]]?.componentClass
              return `${cls}_${p[2] === 'count' ? 'count' : 'height_m'}`
            }
            return fields.get(String(p[0])) ?? String(p[0])
          }, out.errors)
        }
      } else {
        const parsed = structureSchema.safeParse(values, { error: inWords })
        if (parsed.success) out.structures.push({ row: r.rowNumber, siteExternalId: String(values.siteExternalId), record: parsed.data })
        else pushZodErrors(sheet, r.rowNumber, parsed.error, p => fields.get(String(p[0])) ?? String(p[0]), out.errors)
      }
    }
  }
  return out
}

function collectComponents(values: Record<string, unknown>) {
  const components: { componentClass: ComponentClass, count: number, heightM: number }[] = []
  const problems: { column: string, message: string }[] = []
  for (const cls of COMPONENT_CLASSES) {
    const count = values[`components.${cls}.count`] as number | null
    const height = values[`components.${cls}.heightM`] as number | null
    if (count === null || count === 0) {
      if (height !== null) problems.push({ column: `${cls}_count`, message: `A height is given but no count: enter the number of ${cls.replace(/_/g, ' ')} components, or clear ${cls}_height_m.` })
      continue
    }
    if (height === null) { problems.push({ column: `${cls}_height_m`, message: `Enter the height of the ${cls.replace(/_/g, ' ')} components in metres.` }); continue }
    components.push({ componentClass: cls, count, heightM: height })
  }
  return { components, problems }
}
