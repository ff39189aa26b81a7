// The best plan under a budget: 0/1 knapsack by dynamic programming over whole cost units, exact
// for costs that are whole multiples of the unit. Values are reductions (per year, or money per
// year); they are turned into integers on a fine decimal grid first so that sums are exact and ties are
// real ties, then resolved deterministically: the larger reduction wins, then the lower cost, then
// the plan that takes the earlier item in the given order.

export interface PlanItem { id: string, cost: number, value: number }

export interface PlanResult {
  /** Ids of the chosen items, in the given order. */
  chosen: string[]
  totalCost: number
  totalValue: number
  /** Money per cost unit the optimisation counted in. */
  costUnit: number
  /** True when every cost was a whole number of units (the plan is then optimal exactly). */
  exact: boolean
  /** Best reduction for each budget: the efficient frontier, at the budgets where it rises. */
  frontier: Array<{ budget: number, value: number }>
}

export interface PlanOptions {
  /** Largest number of cost units the table may span (memory ≈ items × units / 8 bytes). */
  maxUnits?: number
}

const VALUE_DIGITS = 9

function gcd(a: number, b: number): number {
  while (b) [a, b] = [b, a % b]
  return a
}

/** Money → whole cents. */
const cents = (money: number) => Math.round(money * 100)

/**
 * The cost unit: the greatest common divisor of the costs (in cents); coarsened (costs then
 * rounded up, so the plan still never exceeds the budget) when the budget would span more units
 * than `maxUnits`.
 */
function chooseUnit(costs: number[], budgetCents: number, maxUnits: number): { unitCents: number, exact: boolean } {
  let g = 0
  for (const c of costs) if (c > 0) g = gcd(g, c)
  if (g === 0) g = Math.max(1, budgetCents)
  if (budgetCents / g <= maxUnits) return { unitCents: g, exact: true }
  return { unitCents: Math.ceil(budgetCents / maxUnits), exact: false }
}

export function bestPlan(items: readonly PlanItem[], budget: number, options: PlanOptions = {}): PlanResult {
  const maxUnits = options.maxUnits ?? 200_000
  const budgetCents = Math.max(0, Math.floor(budget * 100 + 1e-6))
  const itemCents = items.map(i => cents(i.cost))
  const { unitCents, exact } = chooseUnit(itemCents, budgetCents, maxUnits)
  const W = Math.floor(budgetCents / unitCents)
  const weights = itemCents.map(c => Math.ceil(c / unitCents - 1e-9))
  const maxValue = items.reduce((m, i) => Math.max(m, Math.abs(i.value)), 0)
  // A decimal grid (a power of ten, about 1e-9 of the largest value): values given in decimals land
  // on it exactly, so equal sums stay equal after rounding.
  const scale = maxValue > 0 ? 10 ** (VALUE_DIGITS - Math.floor(Math.log10(maxValue))) : 1
  const values = items.map(i => Math.round(i.value * scale))

  // best[w], costOf[w]: best value (then least cost) of items i…n−1 within w units. Items are
  // processed from the last to the first so that the forward reconstruction can prefer taking the
  // earlier item on a full tie.
  const n = items.length
  let best = new Float64Array(W + 1)
  let costOf = new Float64Array(W + 1)
  let nextBest = new Float64Array(W + 1)
  let nextCost = new Float64Array(W + 1)
  const rowBytes = (W + 8) >> 3
  const take = new Uint8Array(n * rowBytes)
  for (let i = n - 1; i >= 0; i--) {
    const wi = weights[i]!
    const vi = values[i]!
    const ci = itemCents[i]!
    const row = i * rowBytes
    for (let w = 0; w <= W; w++) {
      let bv = best[w]!
      let bc = costOf[w]!
      if (wi <= w && vi >= 0) {
        const tv = best[w - wi]! + vi
        const tc = costOf[w - wi]! + ci
        if (tv > bv || (tv === bv && tc <= bc)) {
          bv = tv; bc = tc
          take[row + (w >> 3)]! |= 1 << (w & 7)
        }
      }
      nextBest[w] = bv
      nextCost[w] = bc
    }
    ;[best, nextBest] = [nextBest, best]
    ;[costOf, nextCost] = [nextCost, costOf]
  }

  const chosen: string[] = []
  let w = W
  let totalCents = 0
  let totalValue = 0
  for (let i = 0; i < n; i++) {
    if (take[i * rowBytes + (w >> 3)]! & (1 << (w & 7))) {
      chosen.push(items[i]!.id)
      w -= weights[i]!
      totalCents += itemCents[i]!
      totalValue += items[i]!.value
    }
  }
  return { chosen, totalCost: totalCents / 100, totalValue, costUnit: unitCents / 100, exact, frontier: frontierOf(best, unitCents, scale) }
}

/** The budgets (in money) at which the best reduction rises, from the final table row. */
function frontierOf(best: Float64Array, unitCents: number, scale: number): Array<{ budget: number, value: number }> {
  const points: Array<{ budget: number, value: number }> = [{ budget: 0, value: best[0]! / scale }]
  for (let w = 1; w < best.length; w++) {
    if (best[w]! > best[w - 1]!) points.push({ budget: (w * unitCents) / 100, value: best[w]! / scale })
  }
  return points
}

/** Reduction per unit of money, the ranking key; items without cost come first when they reduce risk. */
export function reductionPerCost(value: number, cost: number): number {
  if (cost <= 0) return value > 0 ? Number.POSITIVE_INFINITY : 0
  return value / cost
}

/** Items ranked by reduction per unit cost (ties: larger reduction, then id). */
export function rankItems<T extends PlanItem>(items: readonly T[]): T[] {
  return [...items].sort((a, b) => {
    const ra = reductionPerCost(a.value, a.cost)
    const rb = reductionPerCost(b.value, b.cost)
    if (ra !== rb) return rb > ra ? 1 : -1
    if (a.value !== b.value) return b.value - a.value
    return a.id < b.id ? -1 : a.id > b.id ? 1 : 0
  })
}
