// GET /api/inventory/template — the empty import workbook (sheets Sites, Tanks, Structures; notes and drop-downs).
import { writeInventoryWorkbook } from '~~/server/inventory/workbook'

export default defineEventHandler(async (event) => {
  await requireMembership(event)
  const body = await writeInventoryWorkbook()
  setResponseHeaders(event, {
    'content-type': 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
    'content-disposition': 'attachment; filename="stormledger-inventory-template.xlsx"',
  })
  return body
})
