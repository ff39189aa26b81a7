import { describe, expect, it } from 'vitest'
import ExcelJS from 'exceljs'
import { addCautionSheet, addTableSheet, decimalsFor, newWorkbook, NUMBER_FORMATS, safeCell, tableCsv, valueRow, type SheetColumn } from '../../server/utils/sheets'
import { workbookBytes } from '../../server/utils/downloads'
import { CAUTION_FULL } from '../../shared/caution'

async function readBack(wb: ExcelJS.Workbook) {
  const back = new ExcelJS.Workbook()
  await back.xlsx.load(await workbookBytes(wb) as unknown as ExcelJS.Buffer)
  return back
}

describe('number formats of the exports (server/utils/sheets.ts)', () => {
  it('gives frequencies fixed decimals for three significant digits of the smallest value, never scientific', () => {
    // 2.3e-5 /yr: its first significant digit is the 5th decimal, three digits need 7 (arithmetic).
    expect(decimalsFor([21.3, 0.4, 2.3e-5])).toBe('0.0000000')
    // 0.012: three significant digits need 4 decimals (arithmetic).
    expect(decimalsFor([0.012, 0.5])).toBe('0.0000')
    // At least 2 decimals for figures above 1, at most 8 for the smallest; zeros and nulls are ignored (convention chosen here).
    expect(decimalsFor([13.9, 0, null])).toBe('0.00')
    expect(decimalsFor([1e-12])).toBe('0.00000000')
    expect(decimalsFor([])).toBe('0.00')
    for (const f of [decimalsFor([1e-9]), ...Object.values(NUMBER_FORMATS)]) expect(f).not.toMatch(/E/)
  })

  it('writes shares as per cent and money as whole units (common practice)', () => {
    expect(NUMBER_FORMATS.share).toBe('0.0%')
    expect(NUMBER_FORMATS.money).toBe('#,##0')
  })
})

describe('formula-safe cells (OWASP CSV-injection guidance)', () => {
  it('prefixes text a spreadsheet would run, keeps numbers numbers', () => {
    for (const t of ['=1+1', '+cmd|calc', '-2+3', '@SUM(A1)']) expect(safeCell(t)).toBe(`'${t}`)
    expect(safeCell('Tank farm 1')).toBe('Tank farm 1')
    expect(safeCell(-5)).toBe(-5)
    expect(safeCell(Number.NaN)).toBeNull()
  })
})

describe('one table sheet and one CSV from one column list', () => {
  const columns: SheetColumn[] = [
    { header: 'Site', key: 'name', unit: '' },
    { header: 'Expected fires, /yr', key: 'fires', unit: 'fires per year', numFmt: '0.000000' },
    { header: 'Average annual loss (AAL), EUR/yr', key: 'aal', unit: 'EUR per year', numFmt: NUMBER_FORMATS.money },
    { header: 'Insurer\'s share, %', key: 'share', unit: 'share (0–1)', numFmt: NUMBER_FORMATS.share },
  ]
  const rows = [{ name: '=HYPERLINK("x")', fires: 0.000123, aal: 1234.5, share: 0.25 }, { name: 'Bravo', fires: 0.01, aal: 10, share: 1 }]

  it('reads back with headers, units as notes, number formats, a frozen header and a filter', async () => {
    const wb = newWorkbook()
    addTableSheet(wb, 'Sites', columns, rows)
    const ws = (await readBack(wb)).getWorksheet('Sites')!
    expect((ws.getRow(1).values as unknown[]).slice(1)).toEqual(columns.map(c => c.header))
    expect(JSON.stringify(ws.getCell(1, 2).note)).toContain('Unit: fires per year.')
    expect(ws.getCell(2, 1).value).toBe('\'=HYPERLINK("x")')
    expect(ws.getCell(2, 2).value).toBe(0.000123)
    expect(ws.getCell(2, 2).numFmt).toBe('0.000000')
    expect(ws.getCell(2, 3).numFmt).toBe('#,##0')
    expect(ws.getCell(3, 4).numFmt).toBe('0.0%')
    expect(ws.views[0]).toMatchObject({ state: 'frozen', ySplit: 1 })
    expect(ws.autoFilter).toBeTruthy()
  })

  it('writes the same headers and formula-safe text as CSV', () => {
    const csv = tableCsv(columns, rows).split('\r\n')
    expect(csv[0]).toBe('Site,"Expected fires, /yr","Average annual loss (AAL), EUR/yr","Insurer\'s share, %"')
    expect(csv[1]).toBe('"\'=HYPERLINK(""x"")",0.000123,1234.5,0.25')
  })

  it('opens with the caution, then the rows given, with their formats', async () => {
    const wb = newWorkbook()
    addCautionSheet(wb, { title: 'Stormledger test workbook', rows: [valueRow('Average annual loss (AAL), EUR/yr', 1234.5, NUMBER_FORMATS.money), valueRow('Portfolio', '+evil')] })
    const ws = (await readBack(wb)).getWorksheet('Summary')!
    expect(ws.getCell(1, 1).value).toBe('Stormledger test workbook')
    expect(ws.getCell(2, 1).value).toBe('Caution')
    expect(ws.getCell(2, 2).value).toBe(CAUTION_FULL)
    expect(ws.getCell(3, 2).numFmt).toBe('#,##0')
    expect(ws.getCell(4, 2).value).toBe('\'+evil')
  })
})
