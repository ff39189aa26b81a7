// GET /api/capital/options — the organisation's mitigation catalogue (the starter catalogue is added on first look).
import { asc, eq } from 'drizzle-orm'
import { hasModelEffect, NO_EFFECT_REASON } from '~~/shared/capital/actions'
import { useDb } from '~~/server/db'
import { mitigationOptions } from '~~/server/db/schema'
import { ensureCatalogue } from '~~/server/capital/catalogue'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const db = useDb()
  await ensureCatalogue(db, member.organisationId)
  const rows = await db.select().from(mitigationOptions).where(eq(mitigationOptions.organisationId, member.organisationId)).orderBy(asc(mitigationOptions.kind), asc(mitigationOptions.name))
  return { currency: member.currency, options: rows.map(o => ({ ...o, noEffectReason: hasModelEffect(o.kind) ? null : NO_EFFECT_REASON })) }
})
