// The interval printer: ends that share their leading digits get more digits, never "14–14".
// Expected strings are hand-worked from the rule in shared/format.ts (significant figures added
// until the two ends print differently).
import { describe, expect, it } from 'vitest'
import { formatEstimate, formatInterval, formatMoneyRange, formatRange, formatUpperBound, intervalDigits } from '../../shared/format'

describe('formatRange', () => {
  it('keeps two significant figures when they already tell the ends apart', () => {
    expect(formatRange(0.010, 0.014)).toBe('0.010–0.014') // hand-worked: 2 figures differ
  })
  it('adds figures where lo and hi share leading digits', () => {
    expect(formatRange(13.6, 14.4)).toBe('13.6–14.4') // hand-worked: 14–14 at 2 figures, 13.6–14.4 at 3
    expect(formatRange(89.71, 90.3)).toBe('89.7–90.3') // hand-worked: 90–90 at 2 figures
    expect(formatRange(14.01, 14.04)).toBe('14.01–14.04') // hand-worked: 4 figures needed
  })
  it('adds figures in scientific notation too', () => {
    expect(formatRange(1.234e-6, 1.236e-6)).toBe('1.23 × 10⁻⁶–1.24 × 10⁻⁶') // hand-worked: 1.2 both at 2 figures, 1.23/1.24 at 3
    expect(formatRange(1.2341e-6, 1.2344e-6)).toBe('1.2341 × 10⁻⁶–1.2344 × 10⁻⁶') // hand-worked: 5 figures
  })
  it('prints value ± half-width when not even ten figures separate the ends', () => {
    expect(formatRange(14, 14 + 1e-12, 2, undefined, 14)).toBe('14 ± 5.0 × 10⁻¹³') // hand-worked: half of 1e-12
  })
  it('prints a degenerate interval once per end', () => {
    expect(formatRange(0, 0)).toBe('0–0') // hand-worked: equal ends are not a collapse
    expect(intervalDigits(3, 3)).toBe(2) // hand-worked: nothing to separate
  })
})

describe('formatInterval', () => {
  it('writes the value with as many figures as its ends', () => {
    expect(formatInterval(0.012, 0.010, 0.014, '/yr')).toBe('0.012 /yr (0.010–0.014)') // STYLE.md example
    expect(formatInterval(14.02, 13.6, 14.4, '/yr')).toBe('14.0 /yr (13.6–14.4)') // hand-worked: 3 figures
  })
  it('never writes the same text for both ends when they differ', () => {
    for (const [lo, hi] of [[14, 14.2], [89.9, 90.1], [0.0999, 0.1001], [123_456, 123_457], [2.5e-7, 2.50001e-7]] as const) {
      const [a, b] = formatRange(lo, hi).split('–')
      expect(a).not.toBe(b) // the rule of shared/format.ts (common practice: distinct ends)
    }
  })
})

describe('upper bounds and money', () => {
  it('writes an upper bound for figures stopped by the negligible-rate rule', () => {
    expect(formatUpperBound(3.14e-6, '/yr')).toBe('≤ 3.1 × 10⁻⁶ /yr') // hand-worked
    expect(formatEstimate({ rate: 1e-6, lo: 0, hi: 3.14e-6, upperBoundOnly: true }, '/yr')).toBe('≤ 3.1 × 10⁻⁶ /yr (negligible)') // hand-worked
    expect(formatEstimate({ rate: 0.012, lo: 0.010, hi: 0.014 }, '/yr')).toBe('0.012 /yr (0.010–0.014)') // STYLE.md example
  })
  it('adds decimals to money ranges whose whole units collapse', () => {
    expect(formatMoneyRange(12_000, 15_500, 'USD')).toBe('USD 12,000–15,500') // hand-worked
    expect(formatMoneyRange(14_000.2, 14_000.4, 'USD')).toBe('USD 14,000.2–14,000.4') // hand-worked: 1 decimal needed
  })
})
