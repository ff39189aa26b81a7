// Pure parts of the input limits (issue 13, points 5, 7 and 10): the numeric bounds, the messages in
// words, the zip-directory check and the CSV limits.
import { deflateRawSync } from 'node:zlib'
import { describe, expect, it } from 'vitest'
import { z } from 'zod'
import { fitsNumeric, formatNumericMax, MONEY_NUMERIC, numericMax } from '../../shared/schemas/money'
import { fieldLabel, inWords } from '../../shared/schemas/messages'
import { checkZipDirectory, ImportFileError, parseCsv } from '../../server/inventory/workbook'

describe('numeric column bounds', () => {
  it('numeric(p, s) holds 10^(p−s) − 10^(−s) (PostgreSQL documentation, "Numeric Types"; hand-worked)', () => {
    expect(numericMax({ precision: 14, scale: 2 })).toBeCloseTo(999_999_999_999.99, 2)
    expect(formatNumericMax(MONEY_NUMERIC.inventory)).toBe('999,999,999,999.99')
    expect(formatNumericMax(MONEY_NUMERIC.insurance)).toBe('99,999,999,999,999.99')
    expect(numericMax({ precision: 7, scale: 6 })).toBeCloseTo(9.999999, 9)
  })
  it('an amount is checked after rounding to the column scale (999,999,999,999.996 → 10^12 does not fit; hand-worked)', () => {
    expect(fitsNumeric(999_999_999_999.99, MONEY_NUMERIC.inventory)).toBe(true)
    expect(fitsNumeric(999_999_999_999.996, MONEY_NUMERIC.inventory)).toBe(false)
    expect(fitsNumeric(1e12, MONEY_NUMERIC.inventory)).toBe(false)
  })
})

describe('validation messages in words', () => {
  const schema = z.object({ flashDensity: z.number().max(100), siteIds: z.array(z.uuid()).min(1), mode: z.enum(['frequency', 'year']) })
  it('names the field and says what to enter, never the issue code', () => {
    const r = schema.safeParse({ flashDensity: 400, siteIds: [], mode: 'x' }, { error: inWords })
    expect(r.success).toBe(false)
    const messages = r.error!.issues.map(i => i.message)
    expect(messages).toEqual([
      'Flash density: enter a number of at most 100.',
      'Site ids: give at least 1 item.',
      'Mode: choose one of frequency, year.',
    ])
  })
  it('a missing field is "required"; a schema message of its own is kept', () => {
    const own = z.object({ name: z.string('Give the set a name.'), title: z.string() })
    const r = own.safeParse({}, { error: inWords })
    expect(r.error!.issues.map(i => i.message)).toEqual(['Give the set a name.', 'Title: this is required.'])
    expect(fieldLabel(['tanks', 2, 'heightM'])).toBe('tanks, item 3, height m')
  })
})

/** A one-entry zip whose directory states `size` as the entry's uncompressed size (PKWARE APPNOTE.TXT 4.3.12, 4.3.16). */
function zipStating(size: number): Buffer {
  const name = Buffer.from('xl/workbook.xml')
  const data = deflateRawSync(Buffer.from('<workbook/>'))
  const local = Buffer.alloc(30)
  local.writeUInt32LE(0x04034b50, 0)
  const central = Buffer.alloc(46)
  central.writeUInt32LE(0x02014b50, 0); central.writeUInt32LE(data.length, 20); central.writeUInt32LE(size, 24); central.writeUInt16LE(name.length, 28)
  const end = Buffer.alloc(22)
  end.writeUInt32LE(0x06054b50, 0); end.writeUInt16LE(1, 8); end.writeUInt16LE(1, 10)
  end.writeUInt32LE(local.length + name.length + data.length, 16)
  return Buffer.concat([local, name, data, central, name, end])
}

describe('zip directory check', () => {
  it('passes a small workbook and refuses one that states 300 MB (413) before inflating it', () => {
    expect(() => checkZipDirectory(zipStating(11))).not.toThrow()
    let error: unknown
    try { checkZipDirectory(zipStating(300 * 1024 * 1024)) } catch (e) { error = e }
    expect(error).toBeInstanceOf(ImportFileError)
    expect((error as ImportFileError).status).toBe(413)
  })
  it('refuses a file with no directory as damaged (400)', () => {
    expect(() => checkZipDirectory(Buffer.from('PK\u0003\u0004 not really a zip'))).toThrow(/damaged/)
  })
})

describe('CSV limits', () => {
  it('refuses a record with more columns or characters than the limits', () => {
    expect(() => parseCsv('a,b,c\n', { maxColumns: 2, maxLineChars: 100 })).toThrow(/more than 2 columns/)
    expect(() => parseCsv(`a,${'x'.repeat(200)}\n`, { maxColumns: 10, maxLineChars: 100 })).toThrow(/longer than/)
    expect(parseCsv('a,b\n1,2\n', { maxColumns: 2, maxLineChars: 100 })).toEqual([['a', 'b'], ['1', '2']])
  })
})
