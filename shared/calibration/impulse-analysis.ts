// Both impulse methods on one series, side by side; each gives its result or says why it cannot.
import { CalibrationInputError } from './errors'
import type { ImpulseApplication } from './impulse'
import { fitProbit, type ProbitFit } from './probit'
import { upAndDown, type UpAndDownResult } from './up-and-down'

function attempt<T>(fn: () => T): { value: T | null, problem: string | null } {
  try {
    return { value: fn(), problem: null }
  } catch (error) {
    if (error instanceof CalibrationInputError) return { value: null, problem: error.message }
    throw error
  }
}

export interface ImpulseAnalysis {
  upAndDown: UpAndDownResult | null
  upAndDownProblem: string | null
  likelihood: ProbitFit | null
  likelihoodProblem: string | null
  equivalenceFactor: number
  /** Values in the field: test levels × the equivalence factor. */
  field: {
    upAndDownU50Kv: number | null
    likelihoodU50Kv: number | null
    likelihoodU50Interval: { lo: number, hi: number } | null
    sigma: number | null
    sigmaInterval: { lo: number, hi: number } | null
  }
}

export function analyseImpulseSeries(series: readonly ImpulseApplication[], equivalenceFactor: number, minimumUseful: number): ImpulseAnalysis {
  const ud = attempt(() => upAndDown(series, { minimumUseful }))
  const ml = attempt(() => fitProbit(series))
  return {
    upAndDown: ud.value, upAndDownProblem: ud.problem,
    likelihood: ml.value, likelihoodProblem: ml.problem,
    equivalenceFactor,
    field: {
      upAndDownU50Kv: ud.value ? ud.value.u50Kv * equivalenceFactor : null,
      likelihoodU50Kv: ml.value ? ml.value.u50Kv * equivalenceFactor : null,
      likelihoodU50Interval: ml.value ? { lo: ml.value.u50Interval.lo * equivalenceFactor, hi: ml.value.u50Interval.hi * equivalenceFactor } : null,
      // A multiplicative factor shifts ln U50 only; the log scatter σ is unchanged.
      sigma: ml.value?.sigma ?? null,
      sigmaInterval: ml.value?.sigmaInterval ?? null,
    },
  }
}
