// Cost rules of mitigation options: a fixed part plus a rate times one measure of the tank, rounded
// up to the organisation's costing step so that plans can be optimised exactly over whole steps.
import type { TankInput } from '../engine/types'
import type { OptionEffect } from './actions'

export type CostBasis = 'each' | 'diameter_m' | 'height_m' | 'component_count' | 'volume_m3'
export const COST_BASES: readonly CostBasis[] = ['each', 'diameter_m', 'height_m', 'component_count', 'volume_m3']
export const COST_BASIS_LABELS: Record<CostBasis, string> = {
  each: 'per action',
  diameter_m: 'per m of tank diameter',
  height_m: 'per m of tank height',
  component_count: 'per conducting part replaced',
  volume_m3: 'per m³ of tank volume',
}

export interface CostRule { fixedCost: number, rate: number, basis: CostBasis }

/** The measure a cost rule multiplies; a site-level action (no tank) has no tank measure (0). */
export function costMeasure(basis: CostBasis, tank: TankInput | null, option: OptionEffect): number {
  if (basis === 'each') return 1
  if (!tank) return 0
  switch (basis) {
    case 'diameter_m': return tank.diameterM
    case 'height_m': return tank.heightM
    case 'volume_m3': return Math.PI * (tank.diameterM / 2) ** 2 * tank.heightM
    case 'component_count':
      return tank.components
        .filter(c => option.kind !== 'remove_class' || c.componentClass === option.componentClass)
        .reduce((n, c) => n + c.count, 0)
  }
}

/** Cost of one action in money, rounded up to a whole costing step (a step ≤ 0 means cents). */
export function actionCost(rule: CostRule, tank: TankInput | null, option: OptionEffect, step: number): number {
  const raw = rule.fixedCost + rule.rate * costMeasure(rule.basis, tank, option)
  const unit = step > 0 ? step : 0.01
  // The small tolerance keeps 1200.0000000001 (floating-point noise) from rounding up a whole step.
  const steps = Math.ceil(raw / unit - 1e-9)
  return Math.max(0, Math.round(steps * unit * 100) / 100)
}
