// Spreadsheet import: preview counts, all-or-nothing commit, re-import and round trip without change,
// and a clear message for each kind of bad file with nothing written.
import ExcelJS from 'exceljs'
import { SHEET_COLUMNS } from '../../shared/inventory-layout'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createOrganisation, memberClient, type Client } from '../support/accounts'
import { testPool } from '../support/db'
import { downloadTemplate, fillTemplate, inventoryCounts, siteRow, structureRow, tankRow, upload, type Rows } from '../support/inventory'

const pool = testPool()
let org: string
let analyst: Client
let template: ArrayBuffer
afterAll(() => pool.end())

beforeAll(async () => {
  org = await createOrganisation(pool, 'Import Test Operator')
  analyst = await memberClient(pool, org, 'analyst')
  template = await downloadTemplate(analyst)
})

// Two sites, three tanks (two components each), one mast — the counts below follow from this file.
const GOOD: Rows = {
  Sites: [siteRow('IM-1'), siteRow('IM-2', { flash_density_per_km2_yr: null, thunderstorm_days_per_yr: 45 })],
  Tanks: [tankRow('IM-1', 'IM-1-T1', 'TK-1'), tankRow('IM-1', 'IM-1-T2', 'TK-2', { x_m: 9 }), tankRow('IM-2', 'IM-2-T1', 'TK-1', { contents: 'produced_water', material: 'polyethylene' })],
  Structures: [structureRow('IM-1', 'IM-1-M1')],
}

interface Preview { id: string, summary: { sites: Record<string, number>, tanks: Record<string, number>, structures: Record<string, number>, errors: number }, errors: { sheet: string, row: number, column: string, message: string }[] }

async function preview(data: Buffer | string, name = 'inventory.xlsx', type?: string): Promise<Preview> {
  const res = await upload(analyst, data, name, type)
  expect(res.status, await res.clone().text()).toBe(201)
  return res.json()
}

async function commit(id: string) {
  return analyst.post(`/api/inventory/imports/${id}/commit`, {})
}

describe('import of a good file', () => {
  it('previews exact counts without writing, commits everything, and the same file again changes nothing', async () => {
    const file = await fillTemplate(template, GOOD)
    const first = await preview(file)
    // Counts follow from the GOOD rows above (2 sites, 3 tanks, 1 structure, all new).
    expect(first.summary.sites).toEqual({ new: 2, changed: 0, unchanged: 0 })
    expect(first.summary.tanks).toEqual({ new: 3, changed: 0, unchanged: 0 })
    expect(first.summary.structures).toEqual({ new: 1, changed: 0, unchanged: 0 })
    expect(first.errors).toEqual([])
    expect(await inventoryCounts(pool, org)).toEqual({ sites: 0, tanks: 0, components: 0, structures: 0 }) // a preview writes nothing (issue: "commit … or nothing")

    const res = await commit(first.id)
    expect(res.status).toBe(200)
    expect(await inventoryCounts(pool, org)).toEqual({ sites: 2, tanks: 3, components: 6, structures: 1 }) // 3 tanks × 2 component classes
    const stored = await pool.query(`SELECT size_bytes, file_key IS NOT NULL AS kept, status FROM inventory_imports WHERE id = $1`, [first.id])
    expect(stored.rows[0]).toEqual({ size_bytes: file.length, kept: true, status: 'committed' }) // the original file is kept, in object storage (issue, item 3; issue #19 point 5)
    expect((await commit(first.id)).status).toBe(409) // a committed import cannot be committed twice (common practice)

    const { rows: before } = await pool.query(`SELECT max(updated_at) AS t FROM tanks`)
    const again = await preview(file)
    expect(again.summary.sites).toEqual({ new: 0, changed: 0, unchanged: 2 }) // re-importing the same file changes nothing (issue, item 3)
    expect(again.summary.tanks).toEqual({ new: 0, changed: 0, unchanged: 3 })
    expect(again.summary.structures).toEqual({ new: 0, changed: 0, unchanged: 1 })
    expect((await commit(again.id)).status).toBe(200)
    const { rows: after } = await pool.query(`SELECT max(updated_at) AS t FROM tanks`)
    expect(after[0].t).toEqual(before[0].t)
  })

  it('counts a changed row as changed and matches rows by external id', async () => {
    const changed = await fillTemplate(template, { ...GOOD, Tanks: [tankRow('IM-1', 'IM-1-T1', 'TK-1', { height_m: 7.5 }), ...GOOD.Tanks!.slice(1)] })
    const p = await preview(changed)
    expect(p.summary.tanks).toEqual({ new: 0, changed: 1, unchanged: 2 }) // one height edited in the file built here
    expect((await commit(p.id)).status).toBe(200)
    const { rows } = await pool.query(`SELECT height_m FROM tanks WHERE external_id = 'IM-1-T1'`)
    expect(rows[0].height_m).toBe(7.5)
  })

  it('round trip: the export imports back with no change, and user text cannot run as a formula', async () => {
    await pool.query(`UPDATE sites SET name = '=HYPERLINK("http://example.invalid","x")' WHERE external_id = 'IM-2' AND organisation_id = $1`, [org])
    const res = await analyst.get('/api/inventory/export')
    expect(res.status).toBe(200)
    const exported = Buffer.from(await res.arrayBuffer())
    const wb = new ExcelJS.Workbook()
    await wb.xlsx.load(exported as unknown as ArrayBuffer)
    // The export keeps the import layout's headers (units in the names), whatever the shared sheet writer adds.
    expect((wb.getWorksheet('Sites')!.getRow(1).values as unknown[]).slice(1)).toEqual(SHEET_COLUMNS.Sites.map(c => c.header))
    const names = wb.getWorksheet('Sites')!.getColumn(2).values.slice(2)
    const risky = names.find(v => String(v).includes('HYPERLINK'))
    // OWASP CSV-injection guidance: text starting with "=" is written with a leading apostrophe, as a string.
    expect(typeof risky).toBe('string')
    expect(String(risky).startsWith('\'=')).toBe(true)

    const p = await preview(exported, 'export.xlsx')
    expect(p.errors).toEqual([])
    expect(p.summary.sites).toEqual({ new: 0, changed: 0, unchanged: 2 }) // export → import shows 0 changes (issue, item 4)
    expect(p.summary.tanks).toEqual({ new: 0, changed: 0, unchanged: 3 })
    expect(p.summary.structures).toEqual({ new: 0, changed: 0, unchanged: 1 })
  })

  it('a CSV holds one sheet: tanks for sites already in the inventory', async () => {
    const csv = 'site_external_id,tank_external_id,tag,material,height_m,diameter_m,x_m,y_m,contents,flammable_vapour_space,chemical_flash_point_c,grounding,shield_rating_ka,vapour_control,static_dissipator,bonding_upgrade,replacement_value,contents_value,cleanup_cost,interruption_cost,sharp_device_count,sharp_device_height_m,grounded_pipe_count,grounded_pipe_height_m,rounded_conductor_count,rounded_conductor_height_m,carbon_fibre_count,carbon_fibre_height_m\r\n'
      + 'IM-2,IM-2-T9,TK-9,frp,5,3,-12,4,chemical,yes,35,multiple,60,no,no,no,"70,000",1000,2000,3000,1,4,,,,,,\r\n'
    const p = await preview(csv, 'tanks.csv', 'text/csv')
    expect(p.errors).toEqual([])
    expect(p.summary.tanks).toEqual({ new: 1, changed: 0, unchanged: 0 }) // one row in the CSV above
    expect((await commit(p.id)).status).toBe(200)
    const { rows } = await pool.query(`SELECT replacement_value, shield_rating_ka, chemical_flash_point_c FROM tanks WHERE external_id = 'IM-2-T9'`)
    expect(rows[0]).toEqual({ replacement_value: '70000.00', shield_rating_ka: 60, chemical_flash_point_c: 35 }) // numeric(14,2) comes back as text from pg (node-postgres docs)
  })
})

describe('tags that move between tanks, CSV files as spreadsheets write them', () => {
  it('two tanks of a site swap tags in one file (and three rotate): the import commits and each tank has its new tag', async () => {
    const swap = await fillTemplate(template, { ...GOOD, Tanks: [tankRow('IM-1', 'IM-1-T1', 'TK-2'), tankRow('IM-1', 'IM-1-T2', 'TK-1', { x_m: 9 }), GOOD.Tanks![2]!] })
    const p = await preview(swap)
    expect(p.errors).toEqual([]) // the final tags are unique within the site (the rule the import checks)
    expect(p.summary.tanks).toEqual({ new: 0, changed: 2, unchanged: 1 })
    const res = await commit(p.id)
    expect(res.status, await res.clone().text()).toBe(200)
    const tags = async () => Object.fromEntries((await pool.query(`SELECT t.external_id, t.tag FROM tanks t JOIN sites s ON s.id = t.site_id WHERE s.organisation_id = $1 AND s.external_id = 'IM-1' ORDER BY 1`, [org])).rows.map(r => [r.external_id, r.tag]))
    expect(await tags()).toEqual({ 'IM-1-T1': 'TK-2', 'IM-1-T2': 'TK-1' })

    // A third tank joins and the three tags rotate: T1 → TK-3 (new), T2 → TK-2, T3 → TK-1.
    const rotate = await fillTemplate(template, { ...GOOD, Tanks: [tankRow('IM-1', 'IM-1-T1', 'TK-3'), tankRow('IM-1', 'IM-1-T2', 'TK-2', { x_m: 9 }), tankRow('IM-1', 'IM-1-T3', 'TK-1', { x_m: -9 }), GOOD.Tanks![2]!] })
    const r = await preview(rotate)
    expect(r.errors).toEqual([])
    expect((await commit(r.id)).status).toBe(200)
    expect(await tags()).toEqual({ 'IM-1-T1': 'TK-3', 'IM-1-T2': 'TK-2', 'IM-1-T3': 'TK-1' })
    // Back to the file's original tags for the tests that follow.
    await pool.query(`DELETE FROM tanks WHERE external_id = 'IM-1-T3'`)
    const back = await preview(await fillTemplate(template, GOOD))
    expect((await commit(back.id)).status).toBe(200)
  })

  it('a semicolon-separated Windows-1252 file with decimal commas reads the same as the comma file, and the preview says how it was read', async () => {
    const header = 'site_external_id;tank_external_id;tag;material;height_m;diameter_m;x_m;y_m;contents;flammable_vapour_space;chemical_flash_point_c;grounding;shield_rating_ka;vapour_control;static_dissipator;bonding_upgrade;replacement_value;contents_value;cleanup_cost;interruption_cost;sharp_device_count;sharp_device_height_m;grounded_pipe_count;grounded_pipe_height_m;rounded_conductor_count;rounded_conductor_height_m;carbon_fibre_count;carbon_fibre_height_m\r\n'
    const line = 'IM-2;IM-2-T8;Bühne-8;frp;5,5;3;-12;4;chemical;yes;35;multiple;60;no;no;no;70.000,50;1000;2000;3000;1;4;;;;;;\r\n'
    const bytes = Buffer.from([...header + line].map(ch => (ch === 'ü' ? 0xfc : ch.charCodeAt(0)))) // ü is 0xFC in Windows-1252 (WHATWG Encoding Standard index)
    const p = await preview(bytes, 'tanks.csv', 'text/csv')
    expect(p.errors).toEqual([])
    expect((p.summary as { readAs?: string }).readAs).toBe('CSV, semicolon-separated, decimal commas, Windows-1252 text')
    expect((await commit(p.id)).status).toBe(200)
    const { rows } = await pool.query(`SELECT tag, height_m, replacement_value FROM tanks WHERE external_id = 'IM-2-T8'`)
    expect(rows[0]).toEqual({ tag: 'Bühne-8', height_m: 5.5, replacement_value: '70000.50' }) // 70.000,50 is 70000.50 with a decimal comma (common practice)
  })
})

describe('bad files: a clear message, nothing written', () => {
  let clean: Client
  let cleanOrg: string
  beforeAll(async () => {
    cleanOrg = await createOrganisation(pool, 'Import Bad Files Operator')
    clean = await memberClient(pool, cleanOrg, 'analyst')
  })

  async function expectRowError(data: Buffer | string, match: { sheet: string, column?: string, message: RegExp }, name = 'bad.xlsx') {
    const res = await upload(clean, data, name)
    expect(res.status).toBe(201)
    const p = await res.json() as Preview
    expect(p.errors.some(e => e.sheet === match.sheet && (match.column === undefined || e.column === match.column) && match.message.test(e.message)), JSON.stringify(p.errors)).toBe(true)
    const c = await clean.post(`/api/inventory/imports/${p.id}/commit`, {})
    expect(c.status).toBe(400) // all or nothing: a file with errors is not committed (issue, item 3)
    expect(await inventoryCounts(pool, cleanOrg)).toEqual({ sites: 0, tanks: 0, components: 0, structures: 0 })
  }

  async function expectFileError(data: Buffer | string, name: string, status: number, message: RegExp) {
    const res = await upload(clean, data, name)
    expect(res.status).toBe(status)
    expect((await res.json()).statusMessage).toMatch(message)
    expect(await inventoryCounts(pool, cleanOrg)).toEqual({ sites: 0, tanks: 0, components: 0, structures: 0 })
  }

  it('wrong file type', async () => {
    await expectFileError(Buffer.from('%PDF-1.4\n%âãÏÓ\n1 0 obj\n'), 'fleet.pdf', 400, /\.xlsx workbook .*\.csv/) // PDF magic bytes (ISO 32000-1 §7.5.2)
  })

  it('corrupt workbook', async () => {
    const good = await fillTemplate(template, GOOD)
    const truncated = good.subarray(0, Math.floor(good.length / 2)) // a zip cut in half (PKZIP APPNOTE: central directory missing)
    await expectFileError(truncated, 'fleet.xlsx', 400, /could not be read/)
  })

  it('missing sheet', async () => {
    const file = await fillTemplate(template, { Sites: [siteRow('B-1')] }, wb => wb.removeWorksheet(wb.getWorksheet('Tanks')!.id))
    await expectRowError(file, { sheet: 'Tanks', message: /no sheet named Tanks/ })
  })

  it('unknown column', async () => {
    const file = await fillTemplate(template, { Sites: [siteRow('B-1')] }, (wb) => {
      const ws = wb.getWorksheet('Sites')!
      ws.getRow(1).getCell(ws.columnCount + 1).value = 'paint_colour'
    })
    await expectRowError(file, { sheet: 'Sites', column: 'paint_colour', message: /Unknown column/ })
  })

  it('wrong units', async () => {
    const file = await fillTemplate(template, { Sites: [siteRow('B-1')], Tanks: [tankRow('B-1', 'B-1-T1', 'TK-1')] }, (wb) => {
      const ws = wb.getWorksheet('Tanks')!
      const headers = (ws.getRow(1).values as unknown[]).map(String)
      ws.getRow(1).getCell(headers.indexOf('height_m')).value = 'height_ft'
    })
    await expectRowError(file, { sheet: 'Tanks', column: 'height_ft', message: /Wrong unit.*height_m.*metres/ })
  })

  it('duplicate tags', async () => {
    const file = await fillTemplate(template, { Sites: [siteRow('B-1')], Tanks: [tankRow('B-1', 'B-1-T1', 'TK-7'), tankRow('B-1', 'B-1-T2', 'TK-7')] })
    await expectRowError(file, { sheet: 'Tanks', column: 'tag', message: /Duplicate tag TK-7/ })
  })

  it('negative heights', async () => {
    const file = await fillTemplate(template, { Sites: [siteRow('B-1')], Tanks: [tankRow('B-1', 'B-1-T1', 'TK-1', { height_m: -4 })] })
    await expectRowError(file, { sheet: 'Tanks', column: 'height_m', message: /above 0 m/ })
  })

  it('text in number cells', async () => {
    const file = await fillTemplate(template, { Sites: [siteRow('B-1')], Tanks: [tankRow('B-1', 'B-1-T1', 'TK-1', { diameter_m: '12 ft' })] })
    await expectRowError(file, { sheet: 'Tanks', column: 'diameter_m', message: /Text in a number cell.*metres/ })
  })

  it('formula cells', async () => {
    const file = await fillTemplate(template, { Sites: [siteRow('B-1')], Tanks: [tankRow('B-1', 'B-1-T1', 'TK-1', { height_m: { formula: '2*3', result: 6 } })] })
    await expectRowError(file, { sheet: 'Tanks', column: 'height_m', message: /formula/ })
  })

  it('a site with both flash density and thunderstorm days, and a tank on an unknown site', async () => {
    const file = await fillTemplate(template, { Sites: [siteRow('B-1', { thunderstorm_days_per_yr: 40 })], Tanks: [tankRow('NOPE', 'N-T1', 'TK-1')] })
    await expectRowError(file, { sheet: 'Sites', column: 'flash_density_per_km2_yr', message: /not both/ })
    await expectRowError(file, { sheet: 'Tanks', column: 'site_external_id', message: /NOPE is neither/ })
  })

  it('above 10 MB', async () => {
    const big = Buffer.alloc(10 * 1024 * 1024 + 1, 0x41) // one byte over the 10 MB limit of the issue
    await expectFileError(big, 'huge.csv', 413, /10 MB/)
  })

  it('above 50,000 rows', async () => {
    const header = 'site_external_id,name,operator,latitude_deg,longitude_deg,flash_density_per_km2_yr,thunderstorm_days_per_yr,insured_property_value,insured_interruption_value,location_notes\n'
    const lines = Array.from({ length: 50_001 }, (_, i) => `S${i},n,,32,-102,4,,,,\n`).join('') // one row over the 50,000-row limit of the issue
    await expectFileError(header + lines, 'many.csv', 400, /more than 50,000 rows/)
  })
})
