// Saved what-if options (server/api/whatif-options): what the page sends and what sending one to
// the capital plan needs. The parameter ranges are the what-if's own (shared/results/whatif-params.ts).
import { z } from 'zod'
import { currentLawLabels, paramSpecs, type WhatIfCurrentLaw, type WhatIfParams } from '../results/whatif-params'

/** Per year. */
export interface WhatIfFigures { sparkingPerYear: number, directPerYear: number, ignitionPerYear: number }

const rate = z.number().min(0).max(1e6)
const figuresSchema = z.object({ sparkingPerYear: rate, directPerYear: rate, ignitionPerYear: rate })

const paramsSchema = z.object(Object.fromEntries(paramSpecs.map(s => [s.key, z.number().min(s.min).max(s.max)])) as Record<(typeof paramSpecs)[number]['key'], z.ZodNumber>)
  .extend({ currentLaw: z.enum(Object.keys(currentLawLabels) as [WhatIfCurrentLaw, ...WhatIfCurrentLaw[]]) })

const paramKeys: [keyof WhatIfParams, ...(keyof WhatIfParams)[]] = ['currentLaw', ...paramSpecs.map(s => s.key)]
const changeSchema = z.object({
  key: z.enum(paramKeys),
  label: z.string().max(120),
  from: z.union([z.number(), z.string().max(120)]),
  to: z.union([z.number(), z.string().max(120)]),
  unit: z.string().max(40),
})

export const saveWhatIfOptionSchema = z.object({
  label: z.string().trim().max(120, 'At most 120 characters.').default(''),
  /** Opened from a run's site page: the run, site and tank it compares with. */
  runId: z.uuid().nullable().default(null),
  siteId: z.uuid().nullable().default(null),
  tankId: z.uuid().nullable().default(null),
  params: paramsSchema,
  changes: z.array(changeSchema).max(20),
  figures: figuresSchema,
  baselineFigures: figuresSchema.nullable().default(null),
  engineVersion: z.string().min(1).max(40),
}).refine(b => (b.runId === null) === (b.siteId === null) && (b.siteId !== null || b.tankId === null), { message: 'A run, its site and its tank go together.', path: ['runId'] })

export const whatIfOptionsQuerySchema = z.object({ runId: z.uuid().optional(), siteId: z.uuid().optional() })

/** Send a saved option to the capital plan: the catalogue option that realises it. */
export const sendWhatIfOptionSchema = z.object({
  optionId: z.uuid('Choose a mitigation option from the catalogue.'),
})
