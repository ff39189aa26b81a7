// Column helpers for result figures (shared/results/figure.ts): one call declares the columns of a
// figure under its prefix, so the tank, site and portfolio result tables spell them out nowhere.
import { bigint, doublePrecision, numeric } from 'drizzle-orm/pg-core'
import type { FigureName, RateFigureName } from '../../../shared/results/figure'

/** Money figures derived from simulations: numeric with cents, read as numbers. */
export const moneyColumn = (name: string) => numeric(name, { precision: 20, scale: 2, mode: 'number' })

/** `expectedAnnualLoss` → `expected_annual_loss`. */
const snake = (key: string) => key.replace(/[A-Z]/g, c => `_${c.toLowerCase()}`)

export type Prefixed<P extends string, T> = { [K in keyof T & string as `${P}${Capitalize<K>}`]: T[K] }

/** Renames `{ rate, lo }` to `{ directRate, directLo }` (`''` stays the prefix itself). */
export function prefixed<P extends string, T extends Record<string, unknown>>(prefix: P, columns: T): Prefixed<P, T> {
  // The one place where keys are built from the prefix; the mapped type above states the result.
  return Object.fromEntries(Object.entries(columns).map(([k, v]) => [`${prefix}${k.charAt(0).toUpperCase()}${k.slice(1)}`, v])) as Prefixed<P, T>
}

/**
 * An event frequency (/yr): `<p>_rate`, its 95 % interval `<p>_lo` / `<p>_hi`, and `<p>_count`, the
 * whole simulated count behind the rate in simulated-years runs (null in frequency mode).
 */
export function rateFigureColumns<P extends RateFigureName>(p: P) {
  const c = snake(p)
  return prefixed(p, {
    rate: doublePrecision(`${c}_rate`).notNull(),
    lo: doublePrecision(`${c}_lo`).notNull(),
    hi: doublePrecision(`${c}_hi`).notNull(),
    count: bigint(`${c}_count`, { mode: 'number' }),
  })
}

/** A money figure (organisation currency per year): `<p>`, its 95 % interval `<p>_lo` / `<p>_hi`. */
export function moneyFigureColumns<P extends 'expectedAnnualLoss'>(p: P) {
  const c = snake(p)
  return prefixed(p, {
    '': moneyColumn(c).notNull(),
    lo: moneyColumn(`${c}_lo`).notNull(),
    hi: moneyColumn(`${c}_hi`).notNull(),
  })
}

/** The standard error of a figure, `<p>_se` (kept on site and portfolio rows, so roll-ups and comparisons can combine them). */
export function standardErrorColumn<P extends FigureName>(p: P) {
  return prefixed(p, { se: doublePrecision(`${snake(p)}_se`).notNull() })
}

/** The four figures of a result row, with or without their standard errors. */
export const resultFigureColumns = () => ({
  ...rateFigureColumns('direct'), ...rateFigureColumns('sparking'), ...rateFigureColumns('ignition'),
  ...moneyFigureColumns('expectedAnnualLoss'),
})
export const resultStandardErrorColumns = () => ({
  ...standardErrorColumn('direct'), ...standardErrorColumn('sparking'), ...standardErrorColumn('ignition'),
  ...standardErrorColumn('expectedAnnualLoss'),
})
