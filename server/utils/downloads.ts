// Files the app hands out (workbooks, CSV): the headers that make the browser save them under a
// name, and the bytes of a written workbook.
import { setResponseHeaders, type H3Event } from 'h3'
import type ExcelJS from 'exceljs'

const CONTENT_TYPES = {
  xlsx: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
  csv: 'text/csv; charset=utf-8',
} as const

/** Marks the answer as a download of `fileName` (a workbook or CSV text). */
export function setDownloadHeaders(event: H3Event, fileName: string, kind: keyof typeof CONTENT_TYPES = 'xlsx'): void {
  setResponseHeaders(event, { 'content-type': CONTENT_TYPES[kind], 'content-disposition': `attachment; filename="${fileName}"` })
}

/** Today's date (UTC) as it goes into a file name. */
export function fileDate(now = new Date()): string {
  return now.toISOString().slice(0, 10)
}

/** A written workbook as the bytes a route returns. */
export async function workbookBytes(workbook: ExcelJS.Workbook): Promise<Buffer> {
  return Buffer.from(await workbook.xlsx.writeBuffer() as ArrayBuffer)
}
