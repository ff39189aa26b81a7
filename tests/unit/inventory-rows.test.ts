// Reading spreadsheet cells and rows for the inventory import (pure code, no database).
import { describe, expect, it } from 'vitest'
import { SHEET_COLUMNS, TANK_COLUMNS } from '../../shared/inventory-layout'
import { convertCell, validateFile } from '../../server/inventory/rows'
import { parseCsv } from '../../server/inventory/workbook'

const col = (header: string) => TANK_COLUMNS.find(c => c.header === header)!

describe('convertCell', () => {
  it('reads numbers, thousands separators and yes/no, and refuses units, formulas and error cells', () => {
    expect(convertCell(6.5, col('height_m'))).toEqual({ ok: true, value: 6.5 })
    expect(convertCell(' 6.5 ', col('height_m'))).toEqual({ ok: true, value: 6.5 }) // CSV cells are text (RFC 4180)
    expect(convertCell('1,250,000', col('replacement_value'))).toEqual({ ok: true, value: 1_250_000 }) // en-GB thousands separator (common practice)
    expect(convertCell('Yes', col('vapour_control'))).toEqual({ ok: true, value: true })
    expect(convertCell('Fibreglass (FRP)', col('material'))).toEqual({ ok: true, value: 'frp' }) // the label shown in the forms
    const unit = convertCell('20 ft', col('height_m'))
    expect(unit.ok).toBe(false)
    expect(!unit.ok && unit.message).toMatch(/metres/)
    expect(convertCell({ formula: 'A1*2' }, col('height_m')).ok).toBe(false)
    expect(convertCell({ error: '#DIV/0!' }, col('height_m')).ok).toBe(false)
    expect(convertCell(2.5, col('sharp_device_count')).ok).toBe(false) // a count is a whole number
    expect(convertCell(null, col('height_m')).ok).toBe(false) // required
    expect(convertCell(null, col('shield_rating_ka'))).toEqual({ ok: true, value: null }) // optional: no shield
  })

  it('strips the apostrophe the export puts before formula-like text (OWASP CSV-injection guidance)', () => {
    const tag = col('tag')
    expect(convertCell('\'=TK-1', tag)).toEqual({ ok: true, value: '=TK-1' })
    expect(convertCell('\'plain', tag)).toEqual({ ok: true, value: '\'plain' })
  })
})

describe('parseCsv', () => {
  it('handles quotes, doubled quotes, commas and CRLF (RFC 4180)', () => {
    expect(parseCsv('a,"b,c","d ""e"""\r\n1,2,3\r\n')).toEqual([['a', 'b,c', 'd "e"'], ['1', '2', '3']])
  })
})

describe('validateFile', () => {
  it('maps a component error back to its column, and a header in feet to a wrong-unit message', () => {
    const headers = SHEET_COLUMNS.Tanks.map(c => c.header)
    const cells = headers.map(h => ({
      site_external_id: 'S1', tank_external_id: 'T1', tag: 'TK-1', material: 'frp', height_m: 5, diameter_m: 3, x_m: 0, y_m: 0, contents: 'crude',
      flammable_vapour_space: 'yes', grounding: 'single', vapour_control: 'no', static_dissipator: 'no', bonding_upgrade: 'no',
      replacement_value: 1, contents_value: 1, cleanup_cost: 1, interruption_cost: 1, grounded_pipe_count: 1, grounded_pipe_height_m: 9,
    } as Record<string, string | number>)[h] ?? null)
    const result = validateFile({ kind: 'csv', sheets: { Tanks: { headers, rows: [{ rowNumber: 2, cells }] } } })
    // A part inside a 5 m tank cannot stand 9 m tall (the tank schema's rule).
    expect(result.errors).toEqual([expect.objectContaining({ sheet: 'Tanks', row: 2, column: 'grounded_pipe_height_m' })])

    const feet = validateFile({ kind: 'csv', sheets: { Tanks: { headers: headers.map(h => (h === 'diameter_m' ? 'diameter_ft' : h)), rows: [] } } })
    expect(feet.errors).toEqual([
      expect.objectContaining({ column: 'diameter_ft', message: expect.stringMatching(/Wrong unit/) }),
      expect.objectContaining({ column: 'diameter_m', message: expect.stringMatching(/missing/) }),
    ])
  })
})
