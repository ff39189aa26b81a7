// CSV writing for every "download data" action and table export. Cells that a spreadsheet would
// run as a formula (= + - @ tab, carriage return) are prefixed with an apostrophe (OWASP guidance on
// CSV injection).

export interface CsvTable {
  headers: string[]
  rows: (string | number | null | undefined)[][]
}

const FORMULA_START = /^[=+\-@\t\r]/

export function neutraliseFormula(text: string): string {
  return FORMULA_START.test(text) ? `'${text}` : text
}

function cell(value: string | number | null | undefined): string {
  if (value === null || value === undefined) return ''
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : ''
  const text = neutraliseFormula(value)
  return /[",\n\r]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text
}

export function toCsv(table: CsvTable): string {
  return [table.headers, ...table.rows].map(r => r.map(cell).join(',')).join('\r\n') + '\r\n'
}
