// GET /api/capital/plans — saved plans, newest first.
import { desc, eq } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { capitalPlans } from '~~/server/db/schema'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const plans = await useDb().select().from(capitalPlans).where(eq(capitalPlans.organisationId, member.organisationId)).orderBy(desc(capitalPlans.createdAt))
  return { currency: member.currency, plans }
})
