// GET /api/inventory/template — the empty import workbook (sheets Sites, Tanks, Structures; notes and drop-downs).
import { writeInventoryWorkbook } from '~~/server/inventory/workbook'
import { sendWorkbook } from '~~/server/utils/sheets'

export default defineEventHandler(async (event) => {
  await requireMembership(event)
  const body = await writeInventoryWorkbook()
  return sendWorkbook(event, body, 'stormledger-inventory-template.xlsx')
})
