import { z } from 'zod'

export const RUN_MODES = ['frequency', 'year'] as const

/** A run's name when none is given: the portfolio and the UTC day it started ("Dunmere fleet, 2026-03-14"). */
export function defaultRunName(portfolioName: string, at: Date): string {
  return `${portfolioName}, ${at.toISOString().slice(0, 10)}`
}

const runName = z.string().trim().min(1, 'Name the run.').max(120, 'At most 120 characters.')

export const startRunSchema = z.object({
  /** Empty: the portfolio's name and the date (defaultRunName). */
  name: z.string().trim().max(120, 'At most 120 characters.').optional(),
  portfolioId: z.uuid('Choose a portfolio.'),
  assumptionVersionId: z.uuid('Choose an assumption-set version.'),
  mode: z.enum(RUN_MODES, 'Mode is frequency or year.'),
  /** Empty: a random seed is drawn and shown. */
  seed: z.number().int('The seed is a whole number.').min(0, 'The seed is 0 or more.').max(2 ** 48, 'The seed is at most 2⁴⁸.').optional(),
  /** Frequency mode: relative standard error at which a tank stops (0.02 = 2 %). */
  targetRse: z.number().min(0.005, 'The target relative standard error is at least 0.5 %.').max(0.5, 'The target relative standard error is at most 50 %.').default(0.02),
  /**
   * Frequency mode: the negligible-rate rule (/yr). A sampled figure whose upper bound falls below it
   * stops refining and is reported as that upper bound; 0 switches the rule off.
   */
  negligibleRatePerYear: z.number().min(0, 'The negligible rate is 0 (off) or more.').max(1e-3, 'The negligible rate is at most 10⁻³ /yr.').default(1e-5),
  maxSamplesPerTank: z.number().int().min(1000, 'At least 1,000 samples per tank.').max(10_000_000, 'At most 10,000,000 samples per tank.').default(400_000),
  /** Year mode: simulated years per site. */
  years: z.number().int('Years are a whole number.').min(100, 'Simulate at least 100 years.').max(1_000_000, 'Simulate at most 1,000,000 years.').default(10_000),
  /**
   * Year mode: storm clustering — flashes arrive in storms that cover tens of kilometres, so nearby
   * sites share their bad years (each site's long-run rates unchanged). Frequency runs ignore it.
   */
  stormClustering: z.boolean('Storm clustering is on (true) or off (false).').default(false),
  /**
   * Assumption uncertainty: K draws of the uncertain assumptions (0: off; otherwise 50–500). Adds the
   * 5–95 % assumption band to the results, and in frequency mode the sensitivity indices; in simulated
   * years the bands of AAL, expected fires and the return-period losses (draws re-simulated over at most 2,000 years).
   */
  assumptionDraws: z.number().int('Draws are a whole number.').refine(v => v === 0 || (v >= 50 && v <= 500), 'Assumption draws are 0 (off) or 50–500.').default(0),
  /** Sites per chunk of work; results do not depend on it. */
  chunkSize: z.number().int().min(1, 'A chunk holds at least one site.').max(1000, 'A chunk holds at most 1,000 sites.').default(20),
})
export type StartRunInput = z.input<typeof startRunSchema>

/** PATCH /api/runs/:id — rename a run. */
export const renameRunSchema = z.object({ name: runName })
