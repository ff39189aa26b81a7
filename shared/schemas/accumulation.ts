// The accumulation view's query: which worst years, and how closely two sites must co-lose to be grouped.
import { z } from 'zod'
import { ACCUMULATION_DEFAULTS } from '../results/accumulation'

export const accumulationQuerySchema = z.object({
  returnPeriodYears: z.coerce.number().int('The return period is a whole number of years.').min(2, 'The return period is at least 2 years.').max(100_000, 'The return period is at most 100,000 years.').default(ACCUMULATION_DEFAULTS.returnPeriodYears),
  minShareTogether: z.coerce.number().min(0.1, 'Sites are grouped when they lose together in at least 10 % of the worst years either loses in.').max(1, 'The share together is at most 1 (100 %).').default(ACCUMULATION_DEFAULTS.minShareTogether),
})
export type AccumulationQuery = z.output<typeof accumulationQuerySchema>
