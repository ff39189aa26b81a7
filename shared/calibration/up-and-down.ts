// 50 % sparking level by the up-and-down method (IEC 60060-1, up-and-down test for U50).
//
// The reading of the standard implemented here (one impulse per group, n = 1):
// 1. Order. After a spark the next level is one step lower; after no spark, one step higher. A series
//    that breaks this rule is not an up-and-down series and is refused, naming the application.
// 2. Step. The step ΔU is constant (within 5 % of the median step). IEC 60060-1 recommends ΔU of
//    about 1.5 % to 3 % of U50; other steps give a warning, not a refusal.
// 3. Valid part. Applications before the first change of response are the approach to the U50
//    region and are discarded: the valid part starts with the first application whose response
//    differs from the one before it.
// 4. Enough applications. The valid part must hold at least 20 useful applications (IEC 60060-1
//    asks for at least 20 for a U50 determination; from memory). The minimum is a parameter so a
//    laboratory's own stricter rule can be applied, never a smaller one than 2.
// 5. Estimate. U50 is the mean of the levels of the valid part, Σ kᵢ·Uᵢ / Σ kᵢ with kᵢ the number of
//    applications at level Uᵢ.
import { CalibrationInputError } from './errors'
import type { ImpulseApplication } from './impulse'

export const IEC_MINIMUM_USEFUL_APPLICATIONS = 20
const STEP_TOLERANCE = 0.05

export interface UpAndDownLevel { levelKv: number, applications: number, sparks: number }

export interface UpAndDownResult {
  u50Kv: number
  stepKv: number
  /** Index (0-based) of the first useful application in the series. */
  firstUseful: number
  discarded: number
  useful: number
  minimumUseful: number
  levels: UpAndDownLevel[]
  warnings: string[]
  method: string
}

export function upAndDown(series: readonly ImpulseApplication[], options: { minimumUseful?: number } = {}): UpAndDownResult {
  const minimumUseful = Math.max(2, options.minimumUseful ?? IEC_MINIMUM_USEFUL_APPLICATIONS)
  if (series.length === 0) throw new CalibrationInputError('The series is empty: enter the applied levels and whether each one sparked.')
  const badLevel = series.findIndex(a => !(a.levelKv > 0) || !Number.isFinite(a.levelKv))
  if (badLevel >= 0) throw new CalibrationInputError(`Application ${badLevel + 1}: the level must be a voltage above 0 kV.`)
  if (series.length < 2) throw new CalibrationInputError(`An up-and-down series needs at least ${minimumUseful} useful applications; it has 1.`)

  const steps: number[] = []
  for (let i = 1; i < series.length; i++) {
    const before = series[i - 1]!
    const now = series[i]!
    if (before.spark && !(now.levelKv < before.levelKv)) {
      throw new CalibrationInputError(`Application ${i + 1}: after the spark at ${before.levelKv} kV the next level must be one step lower, but it is ${now.levelKv} kV. This is not an up-and-down series.`)
    }
    if (!before.spark && !(now.levelKv > before.levelKv)) {
      throw new CalibrationInputError(`Application ${i + 1}: after no spark at ${before.levelKv} kV the next level must be one step higher, but it is ${now.levelKv} kV. This is not an up-and-down series.`)
    }
    steps.push(Math.abs(now.levelKv - before.levelKv))
  }
  const stepKv = median(steps)
  const uneven = steps.findIndex(s => Math.abs(s - stepKv) > STEP_TOLERANCE * stepKv)
  if (uneven >= 0) {
    throw new CalibrationInputError(`Application ${uneven + 2}: the step is ${round(steps[uneven]!)} kV where the series uses ${round(stepKv)} kV. The up-and-down method needs a constant step.`)
  }

  let firstUseful = -1
  for (let i = 1; i < series.length; i++) if (series[i]!.spark !== series[i - 1]!.spark) { firstUseful = i; break }
  if (firstUseful < 0) {
    const what = series[0]!.spark ? 'sparked' : 'did not spark'
    throw new CalibrationInputError(`Every application ${what}: the response never changed, so the series has not reached the 50 % region. Continue the series.`)
  }
  const valid = series.slice(firstUseful)
  if (valid.length < minimumUseful) {
    throw new CalibrationInputError(`Only ${valid.length} useful applications after the first change of response (application ${firstUseful + 1}); the up-and-down method needs at least ${minimumUseful} (IEC 60060-1). Apply ${minimumUseful - valid.length} more.`)
  }
  const u50Kv = valid.reduce((t, a) => t + a.levelKv, 0) / valid.length

  const byLevel = new Map<number, UpAndDownLevel>()
  for (const a of valid) {
    const key = Math.round(a.levelKv * 1e6) / 1e6
    const row = byLevel.get(key) ?? { levelKv: key, applications: 0, sparks: 0 }
    row.applications++
    if (a.spark) row.sparks++
    byLevel.set(key, row)
  }
  const warnings: string[] = []
  const relativeStep = stepKv / u50Kv
  if (relativeStep < 0.015 || relativeStep > 0.03) {
    warnings.push(`The step is ${(relativeStep * 100).toFixed(1)} % of U50; IEC 60060-1 recommends about 1.5 % to 3 %.`)
  }
  return {
    u50Kv, stepKv, firstUseful, discarded: firstUseful, useful: valid.length, minimumUseful,
    levels: [...byLevel.values()].sort((p, q) => p.levelKv - q.levelKv),
    warnings,
    method: `up-and-down (IEC 60060-1), one impulse per group: mean level of the ${valid.length} applications from the first change of response on`,
  }
}

function median(values: readonly number[]): number {
  const s = [...values].sort((a, b) => a - b)
  const m = Math.floor(s.length / 2)
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2
}

const round = (v: number) => Math.round(v * 1000) / 1000
