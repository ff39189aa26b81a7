// Curves for the current-fit plot: each law's exceedance conditioned on the detection threshold,
// so the recorded currents (which are all ≥ T) can be compared with it.
import { lognormalLaw, powerLaw } from '../engine/current'
import { defaultAssumptions } from '../engine/assumptions'

export interface ExceedanceCurve { name: string, points: [number, number][] }

export function conditionalExceedance(exceedance: (i: number) => number, thresholdKa: number, currentsKa: readonly number[]): [number, number][] {
  const atThreshold = thresholdKa > 0 ? exceedance(thresholdKa) : 1
  return currentsKa.filter(i => i >= thresholdKa).map(i => [i, exceedance(i) / atThreshold])
}

/** Currents from `from` to `to` kA, evenly spaced in log. */
export function logGrid(from: number, to: number, count = 80): number[] {
  const a = Math.log(from)
  const b = Math.log(to)
  return Array.from({ length: count }, (_, k) => Math.exp(a + (b - a) * k / (count - 1)))
}

export function currentFitCurves(fit: { medianKa: number, beta: number }, thresholdKa: number, maxKa = 300): ExceedanceCurve[] {
  const grid = logGrid(Math.max(thresholdKa, 1), maxKa)
  const d = defaultAssumptions
  return [
    { name: `Fitted log-normal (median ${fit.medianKa.toFixed(1)} kA, β ${fit.beta.toFixed(3)})`, points: conditionalExceedance(lognormalLaw(fit.medianKa, fit.beta).exceedance, thresholdKa, grid) },
    { name: `Default power law, IEEE Std 1410 (${d.powerLawMedianKa} kA, ${d.powerLawExponent})`, points: conditionalExceedance(powerLaw(d.powerLawMedianKa, d.powerLawExponent).exceedance, thresholdKa, grid) },
    { name: `Default log-normal, CIGRE (${d.lognormalMedianKa} kA, β ${d.lognormalBeta})`, points: conditionalExceedance(lognormalLaw(d.lognormalMedianKa, d.lognormalBeta).exceedance, thresholdKa, grid) },
  ]
}
