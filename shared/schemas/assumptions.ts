import { z } from 'zod'

export const assumptionSetCreateSchema = z.object({
  name: z.string().trim().min(1, 'Give the set a name.').max(120, 'At most 120 characters.'),
  description: z.string().trim().max(2000, 'At most 2,000 characters.').default(''),
  /** Values that differ from the engine defaults; the rest are the defaults. */
  parameters: z.record(z.string(), z.unknown()).default({}),
  note: z.string().trim().max(2000).default(''),
})

export const assumptionVersionEditSchema = z.object({
  /** Changed values (nested like the assumption set), merged over this version's values. */
  parameters: z.record(z.string(), z.unknown()),
  note: z.string().trim().max(2000, 'At most 2,000 characters.').default(''),
})
