import { describe, expect, it } from 'vitest'
import { formatCoordinates, formatProbability, formatFrequency, formatInterval, formatMoney, formatNumber, formatOnceIn, formatCurrent, formatPotential, roundSignificant } from '../../shared/format'

describe('formatting for reading', () => {
  it('writes small frequencies in scientific notation with superscripts', () => {
    // Expected strings: the house style example in SCREENS.md / STYLE.md ("1.2 × 10⁻³ /yr").
    expect(formatFrequency(1.2e-3)).toBe('1.2 × 10⁻³ /yr')
    expect(formatFrequency(0.0000456)).toBe('4.6 × 10⁻⁵ /yr')
  })

  it('states the return period with two significant figures', () => {
    // 1 / 1.2e-3 = 833.3 years; two significant figures → 830 (STYLE.md example "once in 830 years").
    expect(formatOnceIn(1.2e-3)).toBe('once in 830 years')
    expect(formatOnceIn(0.1)).toBe('once in 10 years')
    expect(formatOnceIn(0)).toBe('never in the simulation')
    expect(formatOnceIn(3)).toBe('3.0 times a year')
  })

  it('writes intervals as value (low–high)', () => {
    // SCREENS.md example: "0.012 /yr (0.010–0.014)".
    expect(formatInterval(0.012, 0.01, 0.014, '/yr')).toBe('0.012 /yr (0.010–0.014)')
  })

  it('keeps plain numbers plain and rounds to significant figures', () => {
    // Arithmetic, common practice.
    expect(roundSignificant(833.33, 2)).toBe(830)
    expect(formatNumber(38.85, 3)).toBe('38.9')
    expect(formatNumber(250000, 2)).toBe('2.5 × 10⁵')
    expect(formatNumber(Number.NaN)).toBe('—')
  })

  it('puts units beside physical quantities and money', () => {
    // Units fixed by MODEL.md (kA, kV); thousands separators: common practice.
    expect(formatCurrent(31)).toBe('31.0 kA')
    expect(formatPotential(38.8)).toBe('38.8 kV')
    expect(formatMoney(1250000, 'EUR')).toBe('EUR 1,250,000')
  })
})

describe('durations', async () => {
  const { formatDuration } = await import('../../shared/format')
  it('reads as minutes and seconds', () => {
    // Arithmetic (common practice): 75 s = 1 min 15 s; 4000 s = 1 h 6 min 40 s → rounded to minutes.
    expect(formatDuration(3)).toBe('3 s')
    expect(formatDuration(75)).toBe('1 min 15 s')
    expect(formatDuration(4000)).toBe('1 h 6 min')
    expect(formatDuration(null)).toBe('—')
  })
})

describe('short money and counts', async () => {
  const { formatMoneyShort, formatCount, formatDateTime } = await import('../../shared/format')
  it('writes axis money in plain currency (issue "Screens a practitioner reads at a glance": USD 15 M, not 1.5 × 10⁷)', () => {
    expect(formatMoneyShort(15_000_000, 'USD')).toBe('USD 15 M')
    expect(formatMoneyShort(850_000, 'EUR')).toBe('EUR 850 k')
    expect(formatMoneyShort(1_250_000_000, 'USD')).toBe('USD 1.25 bn')
    expect(formatMoneyShort(0, 'USD')).toBe('USD 0')
  })
  it('writes counts with thousands separators and moments in UTC (common practice)', () => {
    expect(formatCount(12345)).toBe('12,345')
    expect(formatDateTime('2026-03-14T21:05:00-03:00')).toBe('2026-03-15 00:05 UTC')
  })
})

describe('probabilities and positions (one formatter module, issue #16)', () => {
  it('writes probabilities as per cent, small ones with two significant digits, never an exponent (common practice)', () => {
    expect(formatProbability(0.1234)).toBe('12.3 %')
    expect(formatProbability(0.001)).toBe('0.1 %')
    expect(formatProbability(0.0000321)).toBe('0.0032 %')
    expect(formatProbability(0)).toBe('0 %')
    expect(formatProbability(null)).toBe('—')
  })
  it('writes a position with hemispheres, four decimals (≈ 11 m of latitude; common practice)', () => {
    expect(formatCoordinates(32.05, -102.7)).toBe('32.0500° N, 102.7000° W')
    expect(formatCoordinates(-33.8688, 151.2093)).toBe('33.8688° S, 151.2093° E')
  })
})
