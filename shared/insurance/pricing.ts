// Technical premium (common practice in property pricing): expected insured loss, plus a risk load,
// grossed up for expense and profit loadings taken as shares of the premium:
//   premium = (expected loss + risk load) / (1 − expense ratio − profit ratio),
//   expenses = expense ratio × premium, profit = profit ratio × premium,
// so the lines add up to the premium exactly.

export const RISK_LOAD_METHODS = ['std_dev', 'tvar', 'cost_of_capital'] as const
export type RiskLoadMethod = typeof RISK_LOAD_METHODS[number]

export const riskLoadLabels: Record<RiskLoadMethod, string> = {
  std_dev: 'Share of the standard deviation of the annual insured loss',
  tvar: 'Share of the tail value-at-risk of the annual insured loss',
  cost_of_capital: 'Cost of capital on tail value-at-risk less expected loss',
}

export interface PricingBasis {
  method: RiskLoadMethod
  /** The share (std_dev, tvar) or the annual cost-of-capital rate (cost_of_capital), e.g. 0.1. */
  factor: number
  /** Return period of the tail value-at-risk (tvar and cost_of_capital), years. */
  returnPeriodYears: number
  /** Expenses as a share of the premium, 0 ≤ e, e + profit < 1. */
  expenseRatio: number
  /** Profit as a share of the premium. */
  profitRatio: number
}

export const DEFAULT_PRICING: Readonly<PricingBasis> = Object.freeze({ method: 'cost_of_capital', factor: 0.1, returnPeriodYears: 250, expenseRatio: 0.25, profitRatio: 0.05 })

export interface PremiumBreakdown {
  expectedLoss: number
  /** The risk measure the load is a share of (σ, TVaR or TVaR − expected loss), allocated to the site. */
  riskMeasure: number
  riskLoad: number
  expenses: number
  profit: number
  premium: number
}

/** The breakdown from an expected loss and a risk measure. */
export function technicalPremium(expectedLoss: number, riskMeasure: number, basis: PricingBasis): PremiumBreakdown {
  const retained = 1 - basis.expenseRatio - basis.profitRatio
  // A margin, not 0: 1 − 0.7 − 0.3 is 5.6e-17 in floating point.
  if (!(retained > 1e-9)) throw new RangeError('expense and profit loadings must leave a share of the premium for losses')
  const riskLoad = basis.factor * riskMeasure
  const premium = (expectedLoss + riskLoad) / retained
  return { expectedLoss, riskMeasure, riskLoad, expenses: basis.expenseRatio * premium, profit: basis.profitRatio * premium, premium }
}

/** Line-by-line sum of several breakdowns (a portfolio's total from its sites). */
export function sumBreakdowns(items: readonly PremiumBreakdown[]): PremiumBreakdown {
  const total: PremiumBreakdown = { expectedLoss: 0, riskMeasure: 0, riskLoad: 0, expenses: 0, profit: 0, premium: 0 }
  for (const b of items) {
    total.expectedLoss += b.expectedLoss
    total.riskMeasure += b.riskMeasure
    total.riskLoad += b.riskLoad
    total.expenses += b.expenses
    total.profit += b.profit
    total.premium += b.premium
  }
  return total
}
