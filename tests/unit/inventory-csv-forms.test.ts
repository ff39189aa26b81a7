// CSV files as spreadsheets write them: separators, text encodings and decimal marks (pure code).
import { describe, expect, it } from 'vitest'
import { SHEET_COLUMNS } from '../../shared/inventory-layout'
import { validateFile } from '../../server/inventory/rows'
import { decodeCsvText, detectSeparator, ImportFileError, readInventoryFile } from '../../server/inventory/workbook'

/** One Sites row with the given name, position and flash density (text as written); the template's other required columns filled. */
function sitesCsv(sep: string, name: string, lat: string, lon: string, density: string): string {
  const values: Record<string, string> = { site_external_id: 'S-1', name, latitude_deg: lat, longitude_deg: lon, flash_density_per_km2_yr: density }
  const columns = SHEET_COLUMNS.Sites
  const header = columns.map(c => c.header)
  const row = columns.map(c => values[c.header] ?? (!c.required ? '' : c.kind === 'number' ? '1' : c.kind === 'boolean' ? 'no' : c.values?.[0] ?? 'x'))
  return `${header.join(sep)}\r\n${row.map(v => (v.includes(sep) ? `"${v}"` : v)).join(sep)}\r\n`
}

describe('separators', () => {
  it('finds comma, semicolon and tab from the header row (RFC 4180; spreadsheets with a decimal comma write semicolons — common practice)', () => {
    expect(detectSeparator('site_external_id,name\nS1,A\n')).toBe(',')
    expect(detectSeparator('site_external_id;name\nS1;A,B\n')).toBe(';')
    expect(detectSeparator('site_external_id\tname\nS1\tA\n')).toBe('\t')
    expect(detectSeparator('"site_external_id";"name, with comma"\n')).toBe(';')
    expect(detectSeparator('id|name\n')).toBeNull()
  })

  it('refuses a header it cannot match with a message naming the separators it tried', async () => {
    await expect(readInventoryFile(Buffer.from('id|name\n1|a\n'), 'sites.csv')).rejects.toThrow(/commas, semicolons or tabs/)
  })
})

describe('text encodings', () => {
  it('reads UTF-8 with and without a byte-order mark (Unicode Standard §23.8) and UTF-16 with its mark', () => {
    const name = 'Müllheim Süd'
    expect(decodeCsvText(Buffer.from(name, 'utf8'))).toEqual({ text: name, encoding: 'UTF-8' })
    expect(decodeCsvText(Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(name, 'utf8')]))).toEqual({ text: name, encoding: 'UTF-8' })
    expect(decodeCsvText(Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(name, 'utf16le')]))).toEqual({ text: name, encoding: 'UTF-16' })
  })

  it('reads Windows-1252 when the bytes are not UTF-8 (ü is 0xFC, € is 0x80 in the code page — WHATWG Encoding Standard index)', () => {
    const bytes = Buffer.from([0x4d, 0xfc, 0x6c, 0x6c, 0x20, 0x80]) // "Müll €"
    expect(decodeCsvText(bytes)).toEqual({ text: 'Müll €', encoding: 'Windows-1252' })
  })

  it('refuses control characters instead of garbling names (a UTF-16 file without its mark, binary data)', () => {
    expect(() => decodeCsvText(Buffer.from('site_external_id', 'utf16le'))).toThrow(ImportFileError)
    expect(() => decodeCsvText(Buffer.from([0x61, 0x81, 0x62]))).toThrow(/CSV UTF-8/) // 0x81 is undefined in Windows-1252 (a C1 control in Latin-1)
    expect(() => decodeCsvText(Buffer.from([0x50, 0x4b, 0x05, 0x06, 0x00, 0x00]))).toThrow(/binary data/)
  })
})

describe('a whole file', () => {
  it('reads a semicolon file from a decimal-comma spreadsheet in Windows-1252 with the same values as the comma file', async () => {
    const comma = await readInventoryFile(Buffer.from(sitesCsv(',', 'Müllheim Süd', '47.81', '7.63', '2.5'), 'utf8'), 'sites.csv')
    const semi = sitesCsv(';', 'Müllheim Süd', '47,81', '7,63', '2,5')
    const latin = Buffer.from(new Uint8Array([...semi].map(ch => (ch === 'ü' ? 0xfc : ch.charCodeAt(0)))))
    const read = await readInventoryFile(latin, 'sites.csv')
    expect(read.csv).toEqual({ separator: ';', encoding: 'Windows-1252', decimalComma: true })
    expect(comma.csv).toEqual({ separator: ',', encoding: 'UTF-8', decimalComma: false })
    const a = validateFile(comma)
    const b = validateFile(read)
    expect(b.errors).toEqual([])
    expect(b.sites[0]!.record.name).toBe('Müllheim Süd')
    expect(b.sites[0]!.record.latitudeDeg).toBe(47.81)
    expect(b.sites[0]!.record.flashDensityPerKm2Yr).toBe(2.5)
    expect(b.sites[0]!.record).toEqual(a.sites[0]!.record)
  })

  it('reads dots as thousands only in a decimal-comma file (1.234,5 → 1234.5; 1.500 stays 1.5 in a file without decimal commas)', async () => {
    const tanks = SHEET_COLUMNS.Tanks.map(c => c.header)
    const line = (value: string) => tanks.map(h => (h === 'replacement_value' ? value : h === 'site_external_id' ? 'S1' : h === 'tank_external_id' ? 'T1' : 'x')).join(';')
    const decimal = await readInventoryFile(Buffer.from(`${tanks.join(';')}\n${line('1.234,5')}\n`), 'tanks.csv')
    const cells = (f: typeof decimal) => f.sheets.Tanks!.rows[0]!.cells[tanks.indexOf('replacement_value')]
    expect(decimal.csv?.decimalComma).toBe(true)
    expect(cells(decimal)).toBe('1234.5')
    const points = await readInventoryFile(Buffer.from(`${tanks.join(';')}\n${line('1.500')}\n`), 'tanks.csv')
    expect(points.csv?.decimalComma).toBe(false)
    expect(cells(points)).toBe('1.500')
  })
})
