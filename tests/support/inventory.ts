// Arranging inventory files for import tests: fill the downloaded template with ExcelJS, upload it,
// count what the database holds.
import ExcelJS from 'exceljs'
import type pg from 'pg'
import type { Client } from './accounts'

export type Cell = string | number | boolean | null | { formula: string, result?: number }
export type Rows = Partial<Record<'Sites' | 'Tanks' | 'Structures', Record<string, Cell>[]>>

/** The template with rows written under its headers (by header name). */
export async function fillTemplate(template: ArrayBuffer | Buffer, rows: Rows, edit?: (wb: ExcelJS.Workbook) => void): Promise<Buffer> {
  const wb = new ExcelJS.Workbook()
  await wb.xlsx.load(template as ArrayBuffer)
  for (const [sheetName, list] of Object.entries(rows)) {
    const ws = wb.getWorksheet(sheetName)!
    const headers = (ws.getRow(1).values as unknown[]).slice(1).map(String)
    list!.forEach((record, i) => {
      const row = ws.getRow(i + 2)
      for (const [header, value] of Object.entries(record)) {
        const col = headers.indexOf(header)
        if (col < 0) throw new Error(`no column ${header} on ${sheetName}`)
        row.getCell(col + 1).value = value as ExcelJS.CellValue
      }
      row.commit()
    })
  }
  edit?.(wb)
  return Buffer.from(await wb.xlsx.writeBuffer() as ArrayBuffer)
}

export async function downloadTemplate(client: Client): Promise<ArrayBuffer> {
  const res = await client.get('/api/inventory/template')
  if (res.status !== 200) throw new Error(`template download failed: ${res.status}`)
  return res.arrayBuffer()
}

export async function upload(client: Client, data: Buffer | string, fileName: string, type = 'application/octet-stream'): Promise<Response> {
  const form = new FormData()
  form.append('file', new Blob([typeof data === 'string' ? data : new Uint8Array(data)], { type }), fileName)
  return client.request('POST', '/api/inventory/imports', form)
}

export async function inventoryCounts(pool: pg.Pool, organisationId: string) {
  const { rows } = await pool.query(`SELECT
    (SELECT count(*)::int FROM sites WHERE organisation_id = $1) AS sites,
    (SELECT count(*)::int FROM tanks t JOIN sites s ON s.id = t.site_id WHERE s.organisation_id = $1) AS tanks,
    (SELECT count(*)::int FROM tank_components c JOIN tanks t ON t.id = c.tank_id JOIN sites s ON s.id = t.site_id WHERE s.organisation_id = $1) AS components,
    (SELECT count(*)::int FROM site_structures st JOIN sites s ON s.id = st.site_id WHERE s.organisation_id = $1) AS structures`, [organisationId])
  return rows[0] as { sites: number, tanks: number, components: number, structures: number }
}

export function siteRow(ext: string, over: Record<string, Cell> = {}): Record<string, Cell> {
  return { site_external_id: ext, name: `Site ${ext}`, operator: 'Test operator', latitude_deg: 32.05, longitude_deg: -102.7, flash_density_per_km2_yr: 4.2, ...over }
}

export function tankRow(site: string, ext: string, tag: string, over: Record<string, Cell> = {}): Record<string, Cell> {
  return {
    site_external_id: site, tank_external_id: ext, tag, material: 'frp', height_m: 6.1, diameter_m: 3.7, x_m: 0, y_m: 0,
    contents: 'crude', flammable_vapour_space: 'yes', grounding: 'single', vapour_control: 'no', static_dissipator: 'no', bonding_upgrade: 'no',
    replacement_value: 95000, contents_value: 24000.5, cleanup_cost: 60000, interruption_cost: 45000,
    sharp_device_count: 1, sharp_device_height_m: 5.2, grounded_pipe_count: 2, grounded_pipe_height_m: 5.8, ...over,
  }
}

export function structureRow(site: string, ext: string, over: Record<string, Cell> = {}): Record<string, Cell> {
  return { site_external_id: site, structure_external_id: ext, kind: 'mast', label: 'Radio mast', x_m: 30, y_m: 12, height_m: 24, radius_m: 0.5, ...over }
}
