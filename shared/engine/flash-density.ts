// Ground flash density from thunderstorm days (MODEL.md §1).

export type FlashDensityFormula = 'anderson' | 'iec'

/**
 * Ng in flashes/km²/yr from thunderstorm days Td per year.
 * 'anderson': Ng = 0.04·Td^1.25 (Anderson, as used in IEEE Std 1410 and IEEE Std 1243);
 * 'iec': Ng ≈ 0.1·Td (IEC 62305-2), the cruder rule.
 */
export function flashDensityFromThunderstormDays(td: number, formula: FlashDensityFormula = 'anderson'): number {
  if (!Number.isFinite(td) || td < 0) throw new RangeError(`thunderstorm days must be a number ≥ 0, got ${td}`)
  return formula === 'iec' ? 0.1 * td : 0.04 * Math.pow(td, 1.25)
}

/** Flashes per year falling on a disc of radius R metres: λ = Ng·πR²·1e-6. */
export function flashesPerYearOnDisc(flashDensity: number, radiusM: number): number {
  return flashDensity * Math.PI * radiusM * radiusM * 1e-6
}
