// GET /api/inventory/export?portfolioId= — the inventory (or one readable portfolio) as a workbook in the template layout.
import { eq } from 'drizzle-orm'
import { z } from 'zod'
import { useDb } from '~~/server/db'
import { portfolioSites, sites } from '~~/server/db/schema'
import { inventoryRows } from '~~/server/inventory/export'
import { writeInventoryWorkbook } from '~~/server/inventory/workbook'
import { findReadablePortfolio } from '~~/server/inventory/access'
import { fileDate } from '~~/server/utils/downloads'
import { sendWorkbook } from '~~/server/utils/sheets'

const query = z.object({ portfolioId: z.uuid().optional() })

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.exporters })
  const { portfolioId } = readValidQuery(event, query)
  const db = useDb()
  let siteIds: string[]
  if (portfolioId) {
    await findReadablePortfolio(member, portfolioId)
    siteIds = (await db.select({ id: portfolioSites.siteId }).from(portfolioSites).where(eq(portfolioSites.portfolioId, portfolioId))).map(r => r.id)
  } else {
    siteIds = (await db.select({ id: sites.id }).from(sites).where(eq(sites.organisationId, member.organisationId))).map(r => r.id)
  }
  const body = await writeInventoryWorkbook(await inventoryRows(db, siteIds))
  await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'export', entity: 'inventory', entityId: portfolioId ?? null, after: { sites: siteIds.length } }, { event })
  return sendWorkbook(event, body, `stormledger-inventory-${fileDate()}.xlsx`)
})
