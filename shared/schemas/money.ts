// Money columns and the largest amount each holds, so the forms, the routes and the imports refuse
// what the database could not store (numeric(p, s) holds |x| < 10^(p−s), rounded to s decimals;
// PostgreSQL documentation, "Numeric Types").
export const MONEY_NUMERIC = {
  /** Site insured values and tank values (server/db/schema/inventory.ts). */
  inventory: { precision: 14, scale: 2 },
  /** Policy terms: deductibles and limits (server/db/schema/insurance.ts). */
  insurance: { precision: 16, scale: 2 },
  /** Capital planning costs and budgets (server/db/schema/capital.ts). */
  capital: { precision: 16, scale: 2 },
} as const

/** The largest value a numeric(precision, scale) column holds: 10^(p−s) − 10^(−s). */
export function numericMax(c: { precision: number, scale: number }): number {
  return 10 ** (c.precision - c.scale) - 10 ** -c.scale
}

/** Rounded as the column stores it (half away from zero for the non-negative amounts here). */
export function roundToScale(value: number, scale: number): number {
  const f = 10 ** scale
  return Math.round(value * f) / f
}

/** Whether the amount, once rounded to the column's scale, still fits the column. */
export function fitsNumeric(value: number, c: { precision: number, scale: number }): boolean {
  return Math.abs(roundToScale(value, c.scale)) <= numericMax(c)
}

/** The largest value, written exactly (digit by digit: the double nearest it may print differently). */
export function formatNumericMax(c: { precision: number, scale: number }): string {
  const whole = Number('9'.repeat(c.precision - c.scale)).toLocaleString('en-GB')
  return c.scale > 0 ? `${whole}.${'9'.repeat(c.scale)}` : whole
}
