// How a heatmap turns values into colours: a linear scale, or a log scale when the positive values
// span at least two decades (a factor of 100) — then a linear ramp would give almost every cell the
// same colour. The legend says which (`legendNote`). Zero and negative values on a log scale sit at
// the bottom of the ramp, below the smallest positive value.

export interface ColourScale {
  kind: 'linear' | 'log'
  /** The values at the two ends of the ramp. */
  lo: number
  hi: number
  /** Position on the ramp in [0, 1] of a value (null for none). */
  t: (v: number | null) => number | null
}

/** Ratio of the largest to the smallest positive value from which the log scale is chosen. */
export const LOG_SCALE_SPAN = 100
/** A log scale never reaches below hi × 10⁻⁸ (tiny numerical remainders would stretch it). */
const LOG_FLOOR = 1e-8

export function chooseScale(values: readonly (number | null)[], allowLog = true): ColourScale {
  const finite = values.filter((v): v is number => v !== null && Number.isFinite(v))
  const positive = finite.filter(v => v > 0)
  const hi = finite.length ? Math.max(...finite) : 1
  const minPositive = positive.length ? Math.min(...positive) : 0
  if (allowLog && positive.length >= 2 && hi / minPositive >= LOG_SCALE_SPAN) {
    const lo = Math.max(minPositive, hi * LOG_FLOOR)
    const span = Math.log10(hi) - Math.log10(lo)
    return {
      kind: 'log', lo, hi,
      t: v => (v === null || !Number.isFinite(v) ? null : v <= lo ? 0 : Math.min(1, (Math.log10(v) - Math.log10(lo)) / span)),
    }
  }
  const lo = finite.length ? Math.min(0, ...finite) : 0
  return {
    kind: 'linear', lo, hi,
    t: v => (v === null || !Number.isFinite(v) ? null : hi === lo ? 0.5 : (v - lo) / (hi - lo)),
  }
}

/** What the legend says about the scale. */
export function legendNote(scale: ColourScale): string {
  return scale.kind === 'log' ? 'log scale' : 'linear scale'
}
