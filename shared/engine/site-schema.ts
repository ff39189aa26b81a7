// Validation of site input (the CLI and any untrusted caller); the app validates its own forms with
// its schemas and hands the engine already-valid rows.
import { z } from 'zod'
import type { SiteInput } from './types'
import { EngineInputError } from './assumptions'

const finite = (label: string) => z.number({ error: `${label} must be a number` }).refine(Number.isFinite, { error: `${label} must be a finite number` })
const positive = (label: string, unit: string) => finite(label).refine((v) => v > 0, { error: `${label} must be above 0 ${unit}`.trim() })
const nonNegative = (label: string, unit: string) => finite(label).refine((v) => v >= 0, { error: `${label} must not be negative (${unit})` })
const text = (label: string) => z.string({ error: `${label} must be text` }).min(1, { error: `${label} must not be empty` })

export const componentInputSchema = z.strictObject({
  componentClass: z.enum(['sharp_device', 'grounded_pipe', 'rounded_conductor', 'carbon_fibre'], { error: "componentClass must be one of 'sharp_device', 'grounded_pipe', 'rounded_conductor', 'carbon_fibre'" }),
  count: finite('component count').refine((v) => Number.isInteger(v) && v >= 0, { error: 'component count must be a whole number ≥ 0' }),
  heightM: positive('component height', 'm'),
})

export const tankInputSchema = z.strictObject({
  id: text('tank id'),
  tag: z.string({ error: 'tank tag must be text' }),
  xM: finite('tank x'),
  yM: finite('tank y'),
  heightM: positive('tank height', 'm'),
  diameterM: positive('tank diameter', 'm'),
  material: z.enum(['frp', 'polyethylene', 'steel', 'other'], { error: "tank material must be 'frp', 'polyethylene', 'steel' or 'other'" }),
  contents: z.enum(['crude', 'condensate', 'produced_water', 'fresh_water', 'chemical'], { error: "contents must be 'crude', 'condensate', 'produced_water', 'fresh_water' or 'chemical'" }),
  flammableVapourSpace: z.boolean({ error: 'flammableVapourSpace must be true or false' }),
  chemicalFlashPointC: finite('chemical flash point').nullable().optional(),
  components: z.array(componentInputSchema, { error: 'components must be a list' }),
  shieldRatingKa: nonNegative('shield rating', 'kA').nullable(),
  vapourControl: z.boolean({ error: 'vapourControl must be true or false' }),
  replacementValue: nonNegative('replacement value', 'money'),
  contentsValue: nonNegative('contents value', 'money'),
  cleanupCost: nonNegative('clean-up cost', 'money'),
  interruptionCost: nonNegative('interruption cost', 'money'),
})

export const structureInputSchema = z.strictObject({
  id: text('structure id'),
  kind: z.enum(['mast', 'stack', 'ogw_support', 'building'], { error: "structure kind must be 'mast', 'stack', 'ogw_support' or 'building'" }),
  xM: finite('structure x'),
  yM: finite('structure y'),
  heightM: positive('structure height', 'm'),
  radiusM: nonNegative('structure radius', 'm'),
})

export const siteInputSchema = z.strictObject({
  id: text('site id'),
  name: z.string({ error: 'site name must be text' }),
  flashDensity: nonNegative('flash density Ng', 'flashes/km²/yr'),
  tanks: z.array(tankInputSchema, { error: 'tanks must be a list' }),
  structures: z.array(structureInputSchema, { error: 'structures must be a list' }).default([]),
}).superRefine((site, ctx) => {
  const seen = new Set<string>()
  for (const [index, tank] of site.tanks.entries()) {
    if (seen.has(tank.id)) ctx.addIssue({ code: 'custom', path: ['tanks', index, 'id'], message: `tank id '${tank.id}' appears twice in site '${site.id}'` })
    seen.add(tank.id)
  }
})

/** Validate one site; throws EngineInputError with one line per problem. */
export function parseSite(input: unknown): SiteInput {
  const result = siteInputSchema.safeParse(input)
  if (!result.success) throw EngineInputError.fromZod('Invalid site', result.error)
  return result.data
}
