// Does a change between two estimates exceed simulation noise? The difference over its standard
// error: sqrt(se_a² + se_b²) for independent estimates, or the paired standard error where both were
// measured on the same random numbers (capital-plan reductions). Within noise: |z| ≤ 1.96 (95 %).
import { Z95 } from '../engine/statistics'

export type NoiseVerdict = 'identical' | 'within_noise' | 'exceeds_noise' | 'not_comparable'

export interface ChangeNoise {
  /** b − a, in the figure's unit. */
  difference: number
  /** Standard error of the difference (same unit); null when either side has none. */
  se: number | null
  /** difference / se; null when se is null or 0. */
  z: number | null
  verdict: NoiseVerdict
  /** How the standard error was formed. */
  basis: 'independent' | 'paired' | 'shared_seed' | 'same_inputs_and_seed'
}

export interface SideEstimate { value: number, se: number | null }

export interface NoiseOptions {
  /** The standard error of the difference measured on common random numbers (e.g. a paired scenario). */
  pairedSe?: number
  /**
   * Both runs used one seed: their streams coincide per site and tank, so their errors are positively
   * correlated and sqrt(se_a² + se_b²) overstates the noise of the difference (a conservative test).
   */
  sharedSeed?: boolean
  /** Same seed and the same inputs: the engine is bit-reproducible, so any difference is real (none is expected). */
  sameInputsAndSeed?: boolean
}

/** The change from a to b against simulation noise. */
export function changeVersusNoise(a: SideEstimate | null, b: SideEstimate | null, options: NoiseOptions = {}): ChangeNoise {
  if (!a || !b || !Number.isFinite(a.value) || !Number.isFinite(b.value)) {
    return { difference: Number.NaN, se: null, z: null, verdict: 'not_comparable', basis: 'independent' }
  }
  const difference = b.value - a.value
  if (options.sameInputsAndSeed) {
    return { difference, se: 0, z: null, verdict: difference === 0 ? 'identical' : 'exceeds_noise', basis: 'same_inputs_and_seed' }
  }
  const basis = options.pairedSe !== undefined ? 'paired' : options.sharedSeed ? 'shared_seed' : 'independent'
  const se = options.pairedSe !== undefined ? options.pairedSe : a.se === null || b.se === null ? null : Math.hypot(a.se, b.se)
  if (se === null) return { difference, se: null, z: null, verdict: difference === 0 ? 'identical' : 'not_comparable', basis }
  if (se === 0) return { difference, se, z: null, verdict: difference === 0 ? 'identical' : 'exceeds_noise', basis }
  const z = difference / se
  return { difference, se, z, verdict: Math.abs(z) <= Z95 ? 'within_noise' : 'exceeds_noise', basis }
}

/** Words for a verdict, for tables and exports: "within noise (z = 0.8)". */
export function describeNoise(n: ChangeNoise): string {
  const z = n.z === null ? '' : ` (z = ${n.z >= 0 ? '' : '−'}${Math.abs(n.z).toFixed(1)})`
  switch (n.verdict) {
    case 'identical': return 'no change'
    case 'within_noise': return `within noise${z}`
    case 'exceeds_noise': return `exceeds noise${z}`
    default: return 'no noise estimate'
  }
}

/**
 * Two capital plans measured on one evaluation: actions in both plans carry the same paired figures
 * and cancel, so the change in total reduction is Σ(only in B) − Σ(only in A), with the paired
 * standard errors of those actions added in quadrature (actions on different tanks use independent
 * streams; two actions on one tank share theirs, which this treats as independent).
 */
export function planChangeVersusNoise(onlyInA: readonly { rate: number, se: number }[], onlyInB: readonly { rate: number, se: number }[]): ChangeNoise {
  const sum = (xs: readonly { rate: number }[]) => xs.reduce((t, x) => t + x.rate, 0)
  const pairedSe = Math.sqrt([...onlyInA, ...onlyInB].reduce((t, x) => t + x.se * x.se, 0))
  return changeVersusNoise({ value: 0, se: null }, { value: sum(onlyInB) - sum(onlyInA), se: null }, { pairedSe })
}
