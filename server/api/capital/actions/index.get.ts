// GET /api/capital/actions — candidate actions with their measured reductions and rank (latest evaluation).
import { z } from 'zod'
import { useDb } from '~~/server/db'
import { rankedActions } from '~~/server/capital/plans'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const { metric } = readValidQuery(event, z.object({ metric: z.enum(['loss', 'ignition']).default('loss') }))
  const result = await rankedActions(useDb(), member.organisationId, metric)
  return { currency: member.currency, metric, ...result }
})
