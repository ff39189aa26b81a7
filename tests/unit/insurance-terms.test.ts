// Policy terms, financial summaries and the technical premium on small hand-made event tables.
// Every expected figure is worked out by hand in the comments beside it.
import { describe, expect, it } from 'vitest'
import seedrandom from 'seedrandom'
import { applySiteTerms, computeFinancials, NO_TERMS, tailWeights, technicalPremium, termsProblems, type PricingBasis, type SiteTerms } from '../../shared/insurance'

// Four simulated years. Year 0: two events (100, then 300); year 1: 50; year 2: 1000; year 3: none.
const events = { year: [0, 0, 1, 2], loss: [100, 300, 50, 1000] }
const terms = (t: Partial<SiteTerms>): SiteTerms => ({ ...NO_TERMS, ...t })

describe('terms on one site (worked by hand in the test)', () => {
  it('applies the per-occurrence deductible and limit, then the aggregate deductible, then the share', () => {
    const t = applySiteTerms(events, 4, terms({ occurrenceDeductible: 80, occurrenceLimit: 400, aggregateDeductible: 100, aggregateLimit: 500, share: 0.5 }))
    // Occurrence-net: 100 → 20; 300 → 220; 50 → 0; 1000 → min(920, 400) = 400.
    // Year 0 running total 20 (under the aggregate deductible 100: 0 covered), then 240 → 140 covered by the second event.
    expect(Array.from(t.eventAfterTerms)).toEqual([0, 140, 0, 300]) // year 2: 400 − 100 = 300
    expect(Array.from(t.afterTerms.yearLosses)).toEqual([140, 0, 300, 0])
    expect(Array.from(t.insured.yearLosses)).toEqual([70, 0, 150, 0]) // × share 0.5
    expect(Array.from(t.insured.yearMaxEventLoss)).toEqual([70, 0, 150, 0])
    expect(Array.from(t.groundUp.yearLosses)).toEqual([400, 50, 1000, 0])
    expect(Array.from(t.groundUp.yearMaxEventLoss)).toEqual([300, 50, 1000, 0])
    expect(t.deductibleReachedYears).toBe(2) // years 0 and 2 pay something
    expect(t.lossYears).toBe(3)
  })

  it('caps each year at the aggregate limit, eroding it in event order', () => {
    const t = applySiteTerms(events, 4, terms({ aggregateDeductible: 100, aggregateLimit: 150 }))
    // Year 0: running 100 → 0 covered; running 400 → min(300, 150) = 150. Year 1: 50 → 0. Year 2: min(900, 150) = 150.
    expect(Array.from(t.eventAfterTerms)).toEqual([0, 150, 0, 150])
    expect(Array.from(t.afterTerms.yearLosses)).toEqual([150, 0, 150, 0])
  })

  it('takes events of one year in their order even when other years come between them', () => {
    const t = applySiteTerms({ year: [0, 1, 0], loss: [60, 500, 60] }, 2, terms({ aggregateDeductible: 100 }))
    // Year 0: running 60 → 0 covered; running 120 → 20 covered by the third event. Year 1: 500 − 100 = 400.
    expect(Array.from(t.eventAfterTerms)).toEqual([0, 400, 20])
  })

  it('a zero deductible, no limit and a 100 % share give back the ground-up losses (definition of the terms)', () => {
    const t = applySiteTerms(events, 4, NO_TERMS)
    expect(Array.from(t.insured.yearLosses)).toEqual([400, 50, 1000, 0])
    expect(Array.from(t.eventInsured)).toEqual(events.loss)
  })

  it('rejects an event outside the simulated years', () => {
    expect(() => applySiteTerms({ year: [4], loss: [1] }, 4)).toThrow(RangeError)
  })

  it('reports terms a person cannot mean', () => {
    expect(termsProblems(terms({ share: 1.2, occurrenceDeductible: -1, occurrenceLimit: 0 }))).toHaveProperty('share')
    expect(Object.keys(termsProblems(terms({ share: 1.2, occurrenceDeductible: -1, occurrenceLimit: 0 }))).sort()).toEqual(['occurrenceDeductible', 'occurrenceLimit', 'share'])
    expect(termsProblems(NO_TERMS)).toEqual({})
  })
})

describe('properties over random event tables (definition of deductibles and limits)', () => {
  const rand = seedrandom('insurance-properties')
  const table = (n: number, years: number) => ({
    year: Array.from({ length: n }, () => Math.floor(rand() * years)),
    loss: Array.from({ length: n }, () => Math.round(10 ** (2 + 4 * rand()))),
  })
  const randomTerms = (): SiteTerms => ({
    occurrenceDeductible: Math.round(rand() * 5000),
    occurrenceLimit: rand() < 0.3 ? null : 1000 + Math.round(rand() * 50_000),
    aggregateDeductible: Math.round(rand() * 10_000),
    aggregateLimit: rand() < 0.3 ? null : 2000 + Math.round(rand() * 80_000),
    interruptionDeductible: 0,
    share: Math.round(rand() * 100) / 100,
  })

  it('never pays more than a limit per event or per year, nor more than the ground-up loss', () => {
    for (let trial = 0; trial < 200; trial++) {
      const e = table(60, 20)
      const t = randomTerms()
      const r = applySiteTerms(e, 20, t)
      for (let k = 0; k < e.loss.length; k++) {
        expect(r.eventAfterTerms[k]).toBeLessThanOrEqual(t.occurrenceLimit ?? Infinity)
        expect(r.eventAfterTerms[k]).toBeLessThanOrEqual(e.loss[k]!)
        expect(r.eventAfterTerms[k]).toBeGreaterThanOrEqual(0)
      }
      for (let y = 0; y < 20; y++) {
        expect(r.afterTerms.yearLosses[y]).toBeLessThanOrEqual((t.aggregateLimit ?? Infinity) + 1e-9)
        expect(r.insured.yearLosses[y]).toBeLessThanOrEqual(r.groundUp.yearLosses[y]! + 1e-9)
      }
    }
  })

  it('never raises the insured loss when a deductible is raised', () => {
    for (let trial = 0; trial < 200; trial++) {
      const e = table(60, 20)
      const t = randomTerms()
      const base = applySiteTerms(e, 20, t)
      const higherOccurrence = applySiteTerms(e, 20, { ...t, occurrenceDeductible: t.occurrenceDeductible + 1 + rand() * 5000 })
      const higherAggregate = applySiteTerms(e, 20, { ...t, aggregateDeductible: t.aggregateDeductible + 1 + rand() * 5000 })
      for (let y = 0; y < 20; y++) {
        expect(higherOccurrence.insured.yearLosses[y]).toBeLessThanOrEqual(base.insured.yearLosses[y]! + 1e-9)
        expect(higherAggregate.insured.yearLosses[y]).toBeLessThanOrEqual(base.insured.yearLosses[y]! + 1e-9)
      }
    }
  })
})

describe('technical premium (common practice: loadings as shares of the premium)', () => {
  it('grosses the expected loss and risk load up for expenses and profit, line by line', () => {
    const basis: PricingBasis = { method: 'tvar', factor: 0.1, returnPeriodYears: 250, expenseRatio: 0.25, profitRatio: 0.05 }
    const b = technicalPremium(100, 200, basis)
    expect(b.riskLoad).toBeCloseTo(20, 12) // 0.1 × 200
    expect(b.premium).toBeCloseTo(120 / 0.7, 10) // (100 + 20) / (1 − 0.25 − 0.05) = 171.43
    expect(b.expenses).toBeCloseTo(0.25 * 120 / 0.7, 10) // 42.86
    expect(b.profit).toBeCloseTo(0.05 * 120 / 0.7, 10) // 8.57
    expect(b.expectedLoss + b.riskLoad + b.expenses + b.profit).toBeCloseTo(b.premium, 10)
  })

  it('refuses loadings that leave nothing for losses', () => {
    expect(() => technicalPremium(1, 1, { method: 'std_dev', factor: 0.1, returnPeriodYears: 10, expenseRatio: 0.7, profitRatio: 0.3 })).toThrow(RangeError)
  })
})

describe('portfolio figures and the sites behind its tail (worked by hand in the test)', () => {
  // Site A: 100 in year 0, 300 in year 2. Site B: 50 in year 0, 200 in year 1. Portfolio years: 150, 200, 300, 0.
  const sites = [
    { siteId: 'a', events: { year: [0, 2], loss: [100, 300] }, terms: null },
    { siteId: 'b', events: { year: [0, 1], loss: [50, 200] }, terms: null },
  ]
  const basis: PricingBasis = { method: 'std_dev', factor: 0.5, returnPeriodYears: 2, expenseRatio: 0.2, profitRatio: 0.1 }

  it('adds the sites year by year', () => {
    const f = computeFinancials(sites, 4, basis)
    expect(f.summaries.groundUp.averageAnnualLoss).toBe(162.5) // (150 + 200 + 300 + 0) / 4
    expect(f.summaries.insured.averageAnnualLoss).toBe(162.5) // no terms: insured = ground-up
    expect(f.insuredStandardDeviation).toBeCloseTo(125, 10) // deviations −12.5, 37.5, 137.5, −162.5: Σ² = 46 875, / 3 = 15 625
    expect(f.summaries.groundUp.occurrence.find(r => r.returnPeriodYears === 10)?.loss).toBeNull() // 4 years cannot say
  })

  it('allocates the loss at the return period and the tail value-at-risk to the years and sites behind them', () => {
    const f = computeFinancials(sites, 4, basis)
    const a = f.sites.find(s => s.siteId === 'a')!
    const b = f.sites.find(s => s.siteId === 'b')!
    // T = 2: k = 4 / 2 = 2 → the second-largest year (year 1: 200, all of site B). TVaR = (300 + 200) / 2 = 250.
    expect(f.insuredLossAtTail).toBe(200)
    expect(a.tail.lossContribution).toBe(0)
    expect(b.tail.lossContribution).toBe(200)
    expect(a.tail.tailValueAtRiskContribution).toBe(150) // 300 / 2
    expect(b.tail.tailValueAtRiskContribution).toBe(100) // 200 / 2
    expect(a.tail.shareOfTailValueAtRisk).toBeCloseTo(0.6, 12) // 150 / 250
  })

  it('interpolates between years when the return period does not divide the years', () => {
    // T = 3: k = 4/3; loss = 300 + (1/3)(200 − 300) → weights 2/3 on year 2, 1/3 on year 1.
    const w = tailWeights(new Float64Array([150, 200, 300, 0]), 3)!
    expect(w.loss.get(2)).toBeCloseTo(2 / 3, 12)
    expect(w.loss.get(1)).toBeCloseTo(1 / 3, 12)
    // TVaR = (300 + (1/3)·200) / (4/3) = 275 → weights 3/4 on year 2, 1/4 on year 1.
    expect(w.tvar.get(2)).toBeCloseTo(0.75, 12)
    expect(w.tvar.get(1)).toBeCloseTo(0.25, 12)
  })

  it('allocates the standard deviation by covariance and prices each site; the lines sum to the premium', () => {
    const f = computeFinancials(sites, 4, basis)
    const a = f.sites.find(s => s.siteId === 'a')!
    const b = f.sites.find(s => s.siteId === 'b')!
    // cov(A, S) = (0 − 3750 + 27 500 + 16 250) / 3 = 13 333.3 → / σ 125 = 106.67; cov(B, S) = 6875 / 3 → 18.33.
    expect(a.standardDeviationContribution).toBeCloseTo(320 / 3, 9)
    expect(b.standardDeviationContribution).toBeCloseTo(55 / 3, 9)
    // Site A: expected 100, load 0.5 × 106.67, premium (100 + 53.33) / (1 − 0.2 − 0.1) = 219.05.
    expect(a.premium.premium).toBeCloseTo((100 + 160 / 3) / 0.7, 9)
    // Portfolio: expected 162.5, load 0.5 × 125 (the sites' parts add to σ), premium 225 / 0.7 = 321.43.
    expect(f.premium.premium).toBeCloseTo(225 / 0.7, 9)
    const p = f.premium
    expect(p.expectedLoss + p.riskLoad + p.expenses + p.profit).toBeCloseTo(p.premium, 9)
  })

  it('prices on cost of capital: rate × (TVaR − expected loss), allocated to the sites', () => {
    const f = computeFinancials(sites, 4, { ...basis, method: 'cost_of_capital', factor: 0.1 })
    // Portfolio capital: 250 − 162.5 = 87.5; load 8.75; premium (162.5 + 8.75) / 0.7 = 244.64.
    expect(f.premium.riskLoad).toBeCloseTo(8.75, 9)
    expect(f.premium.premium).toBeCloseTo(171.25 / 0.7, 9)
    const a = f.sites.find(s => s.siteId === 'a')!
    expect(a.premium.riskMeasure).toBeCloseTo(150 - 100, 9) // its TVaR part less its expected loss
  })

  it('reports the share of years with a loss past the deductible', () => {
    const f = computeFinancials([{ siteId: 'a', events: { year: [0, 2], loss: [100, 300] }, terms: terms({ occurrenceDeductible: 150 }) }], 4, basis)
    expect(f.sites[0]!.deductibleReachedShare).toBe(0.25) // only year 2 (300 > 150) of 4
    expect(f.sites[0]!.lossYearShare).toBe(0.5)
    expect(f.sites[0]!.averageAnnualLoss.insured).toBe(37.5) // (300 − 150) / 4
  })

  it('refuses a return period longer than the run', () => {
    expect(() => computeFinancials(sites, 4, { ...basis, returnPeriodYears: 250 })).toThrow(RangeError)
  })
})
