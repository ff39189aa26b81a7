// GET /api/capital/options?archived=hide|include|only — the organisation's mitigation catalogue (the starter catalogue is added on first look; archived options hidden by default).
import { and, asc, eq } from 'drizzle-orm'
import { archivedQuerySchema } from '~~/shared/schemas/archive'
import { archivedFilter } from '~~/server/archive/records'
import { hasModelEffect, NO_EFFECT_REASON } from '~~/shared/capital/actions'
import { useDb } from '~~/server/db'
import { mitigationOptions } from '~~/server/db/schema'
import { ensureCatalogue } from '~~/server/capital/catalogue'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const { archived } = readValidQuery(event, archivedQuerySchema)
  const db = useDb()
  await ensureCatalogue(db, member.organisationId)
  const rows = await db.select().from(mitigationOptions).where(and(eq(mitigationOptions.organisationId, member.organisationId), archivedFilter(mitigationOptions.archivedAt, archived))).orderBy(asc(mitigationOptions.kind), asc(mitigationOptions.name))
  return { currency: member.currency, options: rows.map(o => ({ ...o, noEffectReason: hasModelEffect(o.kind) ? null : NO_EFFECT_REASON })) }
})
