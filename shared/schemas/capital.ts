import { z } from 'zod'

export const MITIGATION_KIND_VALUES = ['shield', 'remove_class', 'steel_tank', 'vapour_control', 'mast', 'grounding', 'static_dissipator'] as const
export const COST_BASIS_VALUES = ['each', 'diameter_m', 'height_m', 'component_count', 'volume_m3'] as const
export const COMPONENT_CLASS_VALUES = ['sharp_device', 'grounded_pipe', 'rounded_conductor', 'carbon_fibre'] as const
export const PLAN_METRICS = ['loss', 'ignition'] as const

const money = (label: string) => z.number(`${label} is a number.`).min(0, `${label} is not negative.`).max(1e12, `${label} is at most 1,000,000,000,000.`)

export const optionCostSchema = z.object({
  name: z.string().trim().min(1, 'Give the option a name.').max(120, 'At most 120 characters.'),
  fixedCost: money('The fixed cost'),
  // Capped so that rate × the largest measure (a tank's area, m²) plus the fixed cost fits the numeric(16,2) cost column.
  rate: money('The rate').max(1e9, 'The rate is at most 1,000,000,000 per unit.'),
  costBasis: z.enum(COST_BASIS_VALUES, 'Choose what the rate is per.'),
  costStep: z.number('The costing step is a number.').min(0.01, 'The costing step is at least 0.01.').max(1e9),
  shieldRatingKa: z.number().gt(0, 'A shield rating is above 0 kA.').max(1000, 'At most 1,000 kA.').nullable().optional(),
  componentClass: z.enum(COMPONENT_CLASS_VALUES).nullable().optional(),
  mastHeightM: z.number().gt(0, 'A mast is taller than 0 m.').max(300, 'At most 300 m.').nullable().optional(),
  mastRadiusM: z.number().min(0).max(10).nullable().optional(),
})

export const createOptionSchema = optionCostSchema.extend({ kind: z.enum(MITIGATION_KIND_VALUES, 'Choose the kind of option.') }).superRefine((o, ctx) => {
  if (o.kind === 'shield' && !o.shieldRatingKa) ctx.addIssue({ code: 'custom', path: ['shieldRatingKa'], message: 'A shield needs its rating in kA.' })
  if (o.kind === 'remove_class' && !o.componentClass) ctx.addIssue({ code: 'custom', path: ['componentClass'], message: 'Choose the class of parts replaced.' })
  if (o.kind === 'mast' && !o.mastHeightM) ctx.addIssue({ code: 'custom', path: ['mastHeightM'], message: 'A mast needs its height in m.' })
})

export const updateOptionSchema = optionCostSchema.partial()

/** Which tanks a bulk add covers ("every FRP tank holding crude taller than 5 m"). */
export const tankFilterSchema = z.object({
  material: z.enum(['frp', 'polyethylene', 'steel', 'other']).optional(),
  contents: z.enum(['crude', 'condensate', 'produced_water', 'fresh_water', 'chemical']).optional(),
  minHeightM: z.number().min(0).optional(),
  siteId: z.uuid().optional(),
})

export const createActionsSchema = z.object({
  optionId: z.uuid('Choose an option.'),
  /** Explicit tanks (e.g. a what-if's saved option: its tankId). */
  tankIds: z.array(z.uuid()).max(10_000).optional(),
  /** Or every tank of the organisation matching the filter. */
  filter: tankFilterSchema.optional(),
  /** A mast: the site and its position in site coordinates (m). */
  siteId: z.uuid().optional(),
  mastXM: z.number().min(-10_000).max(10_000).optional(),
  mastYM: z.number().min(-10_000).max(10_000).optional(),
  note: z.string().max(500).default(''),
}).refine(b => b.tankIds || b.filter || b.siteId, 'Choose tanks, a filter, or a site for a mast.')

export const startEvaluationSchema = z.object({
  assumptionVersionId: z.uuid('Choose an assumption-set version.'),
  seed: z.number().int().min(0).max(2 ** 31 - 1).optional(),
  samplesPerTank: z.number().int().min(1000, 'At least 1,000 draws per tank.').max(1_000_000, 'At most 1,000,000 draws per tank.').default(20_000),
  /** Measure this saved plan's actions together per site. */
  planId: z.uuid().optional(),
})

export const bestPlanQuerySchema = z.object({
  budget: z.coerce.number('The budget is a number.').min(0, 'The budget is not negative.').max(1e12),
  metric: z.enum(PLAN_METRICS).default('loss'),
})

export const savePlanSchema = z.object({
  name: z.string().trim().min(1, 'Name the plan.').max(120),
  budget: z.number('The budget is a number.').min(0, 'The budget is not negative.').max(1e12),
  metric: z.enum(PLAN_METRICS).default('loss'),
})
