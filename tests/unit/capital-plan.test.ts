import { describe, expect, it } from 'vitest'
import seedrandom from 'seedrandom'
import { bestPlan, rankItems, type PlanItem } from '../../shared/capital/knapsack'
import { actionCost } from '../../shared/capital/costs'
import { applyActions, mastStructureId } from '../../shared/capital/actions'
import type { SiteInput } from '../../shared/engine/types'

/** Every subset, best by (value, then lower cost, then taking the earlier item): the definition the optimiser must meet. */
function bruteForce(items: PlanItem[], budget: number): { value: number, cost: number, chosen: string[] } {
  const n = items.length
  let best = { value: -1, cost: 0, mask: 0 }
  for (let mask = 0; mask < 1 << n; mask++) {
    let cost = 0
    let value = 0
    for (let i = 0; i < n; i++) if (mask & (1 << i)) { cost += Math.round(items[i]!.cost * 100); value += items[i]!.value }
    if (cost > Math.round(budget * 100)) continue
    const v = Math.round(value * 1e6) // values in the instances are multiples of 1e-6
    const better = v > best.value || (v === best.value && (cost < best.cost || (cost === best.cost && preferEarlier(mask, best.mask, n))))
    if (better) best = { value: v, cost, mask }
  }
  const chosen = items.filter((_, i) => best.mask & (1 << i)).map(i => i.id)
  return { value: best.value / 1e6, cost: best.cost / 100, chosen }
}

/** True when `a` takes the first item where the two subsets differ. */
function preferEarlier(a: number, b: number, n: number): boolean {
  for (let i = 0; i < n; i++) {
    const ia = (a >> i) & 1
    const ib = (b >> i) & 1
    if (ia !== ib) return ia === 1
  }
  return false
}

describe('best plan under a budget (0/1 knapsack)', () => {
  it('equals brute force on small random instances and never exceeds the budget', () => {
    const rand = seedrandom('capital-knapsack')
    for (let trial = 0; trial < 300; trial++) {
      const n = 1 + Math.floor(rand() * 12)
      // Costs in whole hundreds with some equal costs and values, so ties occur (brute force in the test).
      const items: PlanItem[] = Array.from({ length: n }, (_, i) => ({
        id: `a${i}`, cost: 100 * (1 + Math.floor(rand() * 20)), value: Math.floor(rand() * 8) * 1e-6 * 250,
      }))
      const budget = 100 * Math.floor(rand() * 60)
      const plan = bestPlan(items, budget)
      const reference = bruteForce(items, budget)
      expect(plan.exact).toBe(true)
      expect(plan.totalCost).toBeLessThanOrEqual(budget)
      expect(plan.totalValue).toBeCloseTo(reference.value, 9)
      expect(plan.totalCost).toBe(reference.cost)
      expect(plan.chosen).toEqual(reference.chosen)
    }
  })

  it('resolves a full tie by taking the earlier item, whatever the run', () => {
    // Two identical actions and room for one: either is optimal; the rule picks the first (common practice: stable order).
    const items = [{ id: 'x', cost: 500, value: 2 }, { id: 'y', cost: 500, value: 2 }]
    expect(bestPlan(items, 500).chosen).toEqual(['x'])
    expect(bestPlan([...items].reverse(), 500).chosen).toEqual(['y'])
  })

  it('prefers the cheaper of two plans with the same reduction', () => {
    // Worked by hand: {a} and {b, c} both reduce 3; {a} costs 900, {b, c} 800.
    const items = [{ id: 'a', cost: 900, value: 3 }, { id: 'b', cost: 400, value: 1 }, { id: 'c', cost: 400, value: 2 }]
    const plan = bestPlan(items, 1000)
    expect(plan.chosen).toEqual(['b', 'c'])
    expect(plan.totalCost).toBe(800)
  })

  it('never takes an action that increases risk', () => {
    const plan = bestPlan([{ id: 'worse', cost: 0, value: -1 }, { id: 'better', cost: 100, value: 1 }], 1000)
    expect(plan.chosen).toEqual(['better'])
  })

  it('gives a frontier that rises with the budget to the best plan', () => {
    // Worked by hand: costs 1, 2, 3 (× 100) with values 1, 3, 4: best for 100 → 1, 200 → 3, 300 → 4, 400 → 5, 500 → 7, 600 → 8.
    const items = [{ id: 'a', cost: 100, value: 1 }, { id: 'b', cost: 200, value: 3 }, { id: 'c', cost: 300, value: 4 }]
    const { frontier } = bestPlan(items, 600)
    expect(frontier.map(p => [p.budget, Math.round(p.value)])).toEqual([[0, 0], [100, 1], [200, 3], [300, 4], [400, 5], [500, 7], [600, 8]])
  })

  it('plans 3,000 actions in well under a second per run on a small machine', () => {
    const rand = seedrandom('capital-speed')
    const items = Array.from({ length: 3000 }, (_, i) => ({ id: `a${i}`, cost: 100 * (20 + Math.floor(rand() * 400)), value: rand() * 1e-3 }))
    const started = performance.now()
    const plan = bestPlan(items, 2_000_000)
    const ms = performance.now() - started
    console.log(`[capital] knapsack: 3000 actions, budget 2,000,000 in steps of 100 → ${ms.toFixed(0)} ms`)
    expect(plan.totalCost).toBeLessThanOrEqual(2_000_000)
    expect(plan.exact).toBe(true)
    expect(ms).toBeLessThan(5000)
  })

  it('ranks by reduction per unit cost', () => {
    // Worked by hand: 10/1000 = 0.01 > 30/5000 = 0.006 > 2/1000 = 0.002.
    const ranked = rankItems([{ id: 'c', cost: 1000, value: 2 }, { id: 'b', cost: 5000, value: 30 }, { id: 'a', cost: 1000, value: 10 }])
    expect(ranked.map(i => i.id)).toEqual(['a', 'b', 'c'])
  })
})

const tank = (id: string, over: Partial<SiteInput['tanks'][number]> = {}): SiteInput['tanks'][number] => ({
  id, tag: id, xM: 0, yM: 0, heightM: 6, diameterM: 4, material: 'frp', contents: 'crude', flammableVapourSpace: true,
  components: [{ componentClass: 'sharp_device', count: 2, heightM: 5 }, { componentClass: 'grounded_pipe', count: 1, heightM: 5.5 }],
  shieldRatingKa: null, vapourControl: false, replacementValue: 100_000, contentsValue: 50_000, cleanupCost: 20_000, interruptionCost: 30_000, ...over,
})

describe('cost rules and action effects', () => {
  it('costs a fixed part plus a rate times the measure, rounded up to the costing step', () => {
    // Worked by hand: 5,000 + 1,250 × 4 m = 10,000; 3,000 + 700 × 3 parts = 5,100 → 5,200 at steps of 200.
    expect(actionCost({ fixedCost: 5000, rate: 1250, basis: 'diameter_m' }, tank('t'), { kind: 'shield', shieldRatingKa: 150 }, 100)).toBe(10_000)
    expect(actionCost({ fixedCost: 3000, rate: 700, basis: 'component_count' }, tank('t'), { kind: 'grounding' }, 200)).toBe(5200)
    // Only the replaced class counts: 2 sharp devices → 3,000 + 1,400.
    expect(actionCost({ fixedCost: 3000, rate: 700, basis: 'component_count' }, tank('t'), { kind: 'remove_class', componentClass: 'sharp_device' }, 100)).toBe(4400)
  })

  it('changes only what each option acts on', () => {
    const site: SiteInput = { id: 's', name: 's', flashDensity: 4, tanks: [tank('a'), tank('b', { xM: 20 })], structures: [] }
    const after = applyActions(site, [
      { id: '1', option: { kind: 'shield', shieldRatingKa: 120 }, tankId: 'a' },
      { id: '2', option: { kind: 'remove_class', componentClass: 'sharp_device' }, tankId: 'b' },
      { id: '3', option: { kind: 'mast', mastHeightM: 30, mastRadiusM: 0.3 }, tankId: null, mastXM: 10, mastYM: 10 },
      { id: '4', option: { kind: 'grounding' }, tankId: 'a' },
    ])
    expect(after.tanks[0]!.shieldRatingKa).toBe(120)
    expect(after.tanks[0]!.components).toEqual(site.tanks[0]!.components)
    expect(after.tanks[1]!.components.map(c => c.componentClass)).toEqual(['grounded_pipe'])
    expect(after.structures).toEqual([{ id: mastStructureId('3'), kind: 'mast', xM: 10, yM: 10, heightM: 30, radiusM: 0.3 }])
    expect(site.tanks[0]!.shieldRatingKa).toBeNull() // the input is untouched
    const steel = applyActions(site, [{ id: '5', option: { kind: 'steel_tank' }, tankId: 'b' }, { id: '6', option: { kind: 'vapour_control' }, tankId: 'a' }])
    expect(steel.tanks[1]!.material).toBe('steel')
    expect(steel.tanks[0]!.vapourControl).toBe(true)
  })
})
