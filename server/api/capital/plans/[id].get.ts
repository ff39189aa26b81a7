// GET /api/capital/plans/:id — one saved plan: its actions with their figures and each site's actions measured together.
import { useDb } from '~~/server/db'
import { planDetail } from '~~/server/capital/plan-detail'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const id = readId(event, 'Plan')
  const detail = await planDetail(useDb(), member.organisationId, id)
  if (!detail) notFound('Plan')
  return { currency: member.currency, ...detail }
})
