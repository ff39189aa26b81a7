// Property damage and business interruption through the terms, and layers on the portfolio.
// Every expected value is hand-worked in the comment beside it.
import { describe, expect, it } from 'vitest'
import seedrandom from 'seedrandom'
import { applySiteTerms, NO_TERMS, type SiteTerms } from '../../shared/insurance/terms'
import { evaluateLayer, layerPays, layerProblems } from '../../shared/insurance/layers'
import { computeFinancials } from '../../shared/insurance/financials'
import { DEFAULT_PRICING, type PricingBasis } from '../../shared/insurance/pricing'

const terms = (t: Partial<SiteTerms>): SiteTerms => ({ ...NO_TERMS, ...t })
const pricing: PricingBasis = { method: 'std_dev', factor: 0.2, returnPeriodYears: 2, expenseRatio: 0.2, profitRatio: 0.05 }

describe('interruption waiting period and the PD / BI split', () => {
  it('PD pays past the occurrence deductible, BI past the interruption deductible, limit shared in proportion', () => {
    // Event: PD 80 000, BI 30 000. Deductibles 10 000 (PD) and 20 000 (BI): 70 000 + 10 000 = 80 000.
    const e = { year: [0], loss: [110_000], propertyDamage: [80_000] }
    const r = applySiteTerms(e, 1, terms({ occurrenceDeductible: 10_000, interruptionDeductible: 20_000 }))
    expect(r.eventAfterTerms[0]).toBe(80_000)
    expect(r.eventAfterTermsPd[0]).toBe(70_000)
    // Limit 40 000 of the 80 000: PD 70/80 · 40 000 = 35 000, BI 5 000.
    const capped = applySiteTerms(e, 1, terms({ occurrenceDeductible: 10_000, interruptionDeductible: 20_000, occurrenceLimit: 40_000, share: 0.5 }))
    expect(capped.eventAfterTerms[0]).toBe(40_000)
    expect(capped.eventAfterTermsPd[0]).toBeCloseTo(35_000, 9)
    expect(capped.split.businessInterruption.afterTerms.yearLosses[0]).toBeCloseTo(5_000, 9)
    // Share 50 %: insured 20 000, of which PD 17 500.
    expect(capped.eventInsured[0]).toBe(20_000)
    expect(capped.split.propertyDamage.insured.yearLosses[0]).toBeCloseTo(17_500, 9)
  })
  it('a BI shorter than the waiting period pays nothing for BI', () => {
    // BI 15 000 < 20 000: only PD 50 000 − 0 counts.
    const r = applySiteTerms({ year: [0], loss: [65_000], propertyDamage: [50_000] }, 1, terms({ interruptionDeductible: 20_000 }))
    expect(r.eventAfterTerms[0]).toBe(50_000)
    expect(r.split.businessInterruption.afterTerms.yearLosses[0]).toBe(0)
  })
  it('events stored before the split count as property damage, as they did', () => {
    // No propertyDamage: 110 000 less the 10 000 occurrence deductible; the interruption deductible does not apply.
    const r = applySiteTerms({ year: [0], loss: [110_000] }, 1, terms({ occurrenceDeductible: 10_000, interruptionDeductible: 20_000 }))
    expect(r.eventAfterTerms[0]).toBe(100_000)
    expect(r.split.businessInterruption.groundUp.yearLosses[0]).toBe(0)
  })
  it('reconciles over random tables: PD + BI = total, insured ≤ after terms ≤ ground-up (common practice: property test)', () => {
    const rand = seedrandom('pd-bi')
    for (let trial = 0; trial < 200; trial++) {
      const n = 40
      const year = Array.from({ length: n }, () => Math.floor(rand() * 10))
      const loss = Array.from({ length: n }, () => Math.round(10 ** (2 + 4 * rand())))
      const propertyDamage = loss.map(l => Math.round(l * rand()))
      const t = terms({
        occurrenceDeductible: Math.round(rand() * 5000), interruptionDeductible: Math.round(rand() * 5000),
        occurrenceLimit: rand() < 0.3 ? null : 1000 + Math.round(rand() * 50_000),
        aggregateDeductible: Math.round(rand() * 10_000), aggregateLimit: rand() < 0.3 ? null : 2000 + Math.round(rand() * 80_000),
        share: Math.round(rand() * 100) / 100,
      })
      const r = applySiteTerms({ year, loss, propertyDamage }, 10, t)
      for (let y = 0; y < 10; y++) {
        for (const m of ['groundUp', 'afterTerms', 'insured'] as const) {
          expect(r.split.propertyDamage[m].yearLosses[y]! + r.split.businessInterruption[m].yearLosses[y]!).toBeCloseTo(r[m].yearLosses[y]!, 6)
        }
        expect(r.insured.yearLosses[y]!).toBeLessThanOrEqual(r.afterTerms.yearLosses[y]! + 1e-9)
        expect(r.afterTerms.yearLosses[y]!).toBeLessThanOrEqual(r.groundUp.yearLosses[y]! + 1e-9)
        expect(r.split.propertyDamage.afterTerms.yearLosses[y]!).toBeLessThanOrEqual(r.split.propertyDamage.groundUp.yearLosses[y]! + 1e-9)
        expect(r.split.businessInterruption.afterTerms.yearLosses[y]!).toBeLessThanOrEqual(r.split.businessInterruption.groundUp.yearLosses[y]! + 1e-9)
      }
    }
  })
})

describe('layers on the portfolio (hand-worked event sets)', () => {
  // Four simulated years; insured events (year, loss): year 0: 50 000; year 1: 150 000 and 400 000;
  // year 2: nothing; year 3: 90 000, 90 000, 90 000.
  const events = { year: [0, 1, 1, 3, 3, 3], loss: [50_000, 150_000, 400_000, 90_000, 90_000, 90_000] }
  it('what a layer pays', () => {
    expect(layerPays(150_000, 100_000, 200_000)).toBe(50_000)
    expect(layerPays(400_000, 100_000, 200_000)).toBe(200_000)
    expect(layerPays(90_000, 100_000, 200_000)).toBe(0)
    expect(layerPays(400_000, 100_000, null)).toBe(300_000)
  })
  it('per-occurrence 200 000 xs 100 000: attachment hit, exhausted', () => {
    const r = evaluateLayer({ name: 'XoL 1', kind: 'occurrence', attachment: 100_000, limit: 200_000 }, events, 4, pricing)
    // Year 1 only: 50 000 (150 000 − 100 000) + 200 000 (400 000 exhausts it) = 250 000; mean 62 500.
    expect(r.expectedLoss).toBe(62_500)
    expect(r.attachmentProbability).toBe(0.25)
    expect(r.exhaustionProbability).toBe(0.25)
    // Layer's largest event in year 1 is its limit: the occurrence curve never exceeds the limit.
    expect(Math.max(...r.summary.occurrenceCurve.map(p => p.loss))).toBeLessThanOrEqual(200_000)
    // σ of (0, 250 000, 0, 0) with n − 1: √((3·62 500² + 187 500²)/3) = 125 000.
    expect(r.standardDeviation).toBeCloseTo(125_000, 6)
    // Premium: (62 500 + 0.2 · 125 000) / (1 − 0.2 − 0.05) = 87 500 / 0.75 = 116 666.67.
    expect(r.premium.premium).toBeCloseTo(116_666.6667, 3)
  })
  it('annual aggregate 150 000 xs 200 000: several events make a year', () => {
    const r = evaluateLayer({ name: 'Agg', kind: 'aggregate', attachment: 200_000, limit: 150_000 }, events, 4, pricing)
    // Year totals 50 000, 550 000, 0, 270 000 → pays 0, 150 000 (exhausted), 0, 70 000; mean 55 000.
    expect(r.expectedLoss).toBe(55_000)
    expect(r.attachmentProbability).toBe(0.5)
    expect(r.exhaustionProbability).toBe(0.25)
    expect(Math.max(...r.summary.aggregateCurve.map(p => p.loss))).toBeLessThanOrEqual(150_000)
    // The same events, no single one reaching 200 000 in year 3: a per-occurrence layer there pays nothing.
    const occ = evaluateLayer({ name: 'Occ', kind: 'occurrence', attachment: 200_000, limit: 150_000 }, events, 4, pricing)
    expect(occ.expectedLoss).toBe(150_000 / 4)
  })
  it('checks layers a person entered', () => {
    expect(layerProblems({ name: ' ', kind: 'occurrence', attachment: -1, limit: 0 })).toEqual({
      name: 'Give the layer a name.', attachment: 'The attachment is an amount of 0 or more.', limit: 'The limit is more than 0, or empty for no limit.',
    })
  })
  it('the financial view prices layers on the insured events after the site terms', () => {
    // Site A: events year 0: 150 000 (PD 100 000), year 1: 400 000 (PD 300 000); deductible 50 000 on PD, share 50 %.
    // Insured: year 0 (100 000 − 50 000 + 50 000)·0.5 = 50 000; year 1 (300 000 − 50 000 + 100 000)·0.5 = 175 000.
    const sites = [{ siteId: 'a', events: { year: [0, 1], loss: [150_000, 400_000], propertyDamage: [100_000, 300_000] }, terms: terms({ occurrenceDeductible: 50_000, share: 0.5 }) }]
    const f = computeFinancials(sites, 4, { ...DEFAULT_PRICING, returnPeriodYears: 2 }, 10, [{ name: 'L', kind: 'occurrence', attachment: 100_000, limit: 50_000 }])
    expect(f.summaries.insured.averageAnnualLoss).toBe((50_000 + 175_000) / 4)
    // Layer 50 000 xs 100 000 on the insured events: 0 and 50 000 (exhausted) → 12 500 per year.
    expect(f.layers[0]!.expectedLoss).toBe(12_500)
    expect(f.layers[0]!.exhaustionProbability).toBe(0.25)
    // PD + BI = total at portfolio level, ground-up and insured; premium lines too.
    expect(f.splitSummaries.propertyDamage.groundUp.averageAnnualLoss + f.splitSummaries.businessInterruption.groundUp.averageAnnualLoss).toBe(f.summaries.groundUp.averageAnnualLoss)
    expect(f.splitSummaries.propertyDamage.insured.averageAnnualLoss + f.splitSummaries.businessInterruption.insured.averageAnnualLoss).toBeCloseTo(f.summaries.insured.averageAnnualLoss, 6)
    expect(f.premiumSplit.propertyDamage.premium + f.premiumSplit.businessInterruption.premium).toBeCloseTo(f.premium.premium, 6)
    // Largest event: 400 000 ground-up, PD 300 000, insured 175 000.
    expect(f.largestEvents[0]).toMatchObject({ groundUp: 400_000, groundUpPd: 300_000, insured: 175_000 })
    expect(f.hasSplit).toBe(true)
    expect(computeFinancials([{ ...sites[0]!, events: { year: [0], loss: [1] } }], 4, { ...DEFAULT_PRICING, returnPeriodYears: 2 }).hasSplit).toBe(false)
  })
})
