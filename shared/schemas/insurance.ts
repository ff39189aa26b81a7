// Policy terms and the financial view: the zod schemas used by the terms editor, the routes and the import.
import { z } from 'zod'
import { fitsNumeric, formatNumericMax, MONEY_NUMERIC, numericMax } from '../schemas/money'
import { RISK_LOAD_METHODS } from '../insurance/pricing'
import { LAYER_KINDS } from '../insurance/layers'

/** Largest amount the terms' numeric(16, 2) columns hold. */
const MAX_MONEY = numericMax(MONEY_NUMERIC.insurance)
const TOO_LARGE = `is above ${formatNumericMax(MONEY_NUMERIC.insurance)}, the largest amount stored.`

const amount = (what: string) => z.number(`${what} is an amount.`).min(0, `${what} is 0 or more.`).max(MAX_MONEY, `${what} ${TOO_LARGE}`).refine(v => fitsNumeric(v, MONEY_NUMERIC.insurance), `${what} ${TOO_LARGE}`)
const limit = (what: string) => z.number(`${what} is an amount, or empty for no limit.`).gt(0, `${what} is more than 0, or empty for no limit.`).max(MAX_MONEY, `${what} ${TOO_LARGE}`).refine(v => fitsNumeric(v, MONEY_NUMERIC.insurance), `${what} ${TOO_LARGE}`).nullable()

export const siteTermsSchema = z.object({
  siteId: z.uuid('Unknown site.'),
  occurrenceDeductible: amount('The occurrence deductible'),
  occurrenceLimit: limit('The occurrence limit'),
  aggregateDeductible: amount('The aggregate deductible'),
  aggregateLimit: limit('The aggregate limit'),
  /** Business-interruption waiting period as money per occurrence; absent in older clients and files: 0. */
  interruptionDeductible: amount('The interruption deductible (waiting period)').default(0),
  share: z.number('The share is a number from 0 to 1.').min(0, 'The share is 0 % or more.').max(1, 'The share is 100 % or less.'),
})
export type SiteTermsInput = z.infer<typeof siteTermsSchema>

export const termsRowsSchema = z.array(siteTermsSchema).max(50_000, 'At most 50,000 sites per terms version.')
  .refine(rows => new Set(rows.map(r => r.siteId)).size === rows.length, 'A site has one row of terms per version.')

export const termsSetCreateSchema = z.object({
  portfolioId: z.uuid('Choose a portfolio.'),
  name: z.string().trim().min(1, 'Give the terms a name.').max(200, 'At most 200 characters.'),
  description: z.string().trim().max(2000, 'At most 2,000 characters.').default(''),
})

/** A layer on the portfolio's insured loss: per-occurrence excess of loss or annual aggregate. */
export const layerSchema = z.object({
  name: z.string().trim().min(1, 'Give the layer a name.').max(200, 'At most 200 characters.'),
  kind: z.enum(LAYER_KINDS, 'A layer is per occurrence or annual aggregate.'),
  attachment: amount('The attachment'),
  limit: limit('The layer limit'),
})
export type LayerInput = z.infer<typeof layerSchema>

export const layersSchema = z.array(layerSchema).max(20, 'At most 20 layers per terms version.')

export const termsVersionSaveSchema = z.object({
  note: z.string().trim().max(500, 'At most 500 characters.').default(''),
  sites: termsRowsSchema,
  /** Absent: the version's layers stay as they are. */
  layers: layersSchema.optional(),
})

const optionalNumber = z.preprocess(v => (v === '' || v === undefined ? undefined : Number(v)), z.number().optional())

/** Query of the financial view: pricing basis, an optional other terms version, and a deductible what-if. */
export const financialQuerySchema = z.object({
  termsVersionId: z.uuid('Unknown terms version.').optional(),
  method: z.enum(RISK_LOAD_METHODS, 'Risk load is std_dev, tvar or cost_of_capital.').default('cost_of_capital'),
  factor: z.coerce.number().min(0, 'The risk-load factor is 0 or more.').max(10, 'The risk-load factor is at most 10.').default(0.1),
  returnPeriodYears: z.coerce.number().min(2, 'The return period is at least 2 years.').max(100_000).default(250),
  expenseRatio: z.coerce.number().min(0, 'Expenses are 0 % or more.').max(0.9, 'Expenses are at most 90 %.').default(0.25),
  profitRatio: z.coerce.number().min(0, 'Profit is 0 % or more.').max(0.9, 'Profit is at most 90 %.').default(0.05),
  /** What-if: the site to change (all sites when empty) and its new deductibles. */
  whatIfSiteId: z.preprocess(v => (v === '' ? undefined : v), z.uuid().optional()),
  whatIfOccurrenceDeductible: optionalNumber.pipe(z.number().min(0, 'The what-if deductible is 0 or more.').optional()),
  whatIfAggregateDeductible: optionalNumber.pipe(z.number().min(0, 'The what-if aggregate deductible is 0 or more.').optional()),
}).refine(q => q.expenseRatio + q.profitRatio <= 0.95, { message: 'Expense and profit loadings together are at most 95 % of the premium.', path: ['profitRatio'] })
export type FinancialQuery = z.output<typeof financialQuerySchema>
