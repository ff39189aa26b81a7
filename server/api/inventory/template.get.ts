// GET /api/inventory/template — the empty import workbook (sheets Sites, Tanks, Structures; notes and drop-downs).
import { writeInventoryWorkbook } from '~~/server/inventory/workbook'
import { setDownloadHeaders } from '~~/server/utils/downloads'

export default defineEventHandler(async (event) => {
  await requireMembership(event)
  const body = await writeInventoryWorkbook()
  setDownloadHeaders(event, 'stormledger-inventory-template.xlsx')
  return body
})
