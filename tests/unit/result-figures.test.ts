import { describe, expect, it } from 'vitest'
import { getTableConfig } from 'drizzle-orm/pg-core'
import { runPortfolioResults, runSiteResults, runTankResults } from '../../server/db/schema'
import { figureFromCount, figureFromEstimate } from '../../shared/results/figure'
import { figureValues, tankFigureValues, toFigures } from '../../server/results/figures'
import { sumCounts } from '../../server/runs/figures'

const columnNames = (t: Parameters<typeof getTableConfig>[0]) => getTableConfig(t).columns.map(c => c.name)

describe('result figure columns (server/db/schema/figures.ts)', () => {
  // The names of migrations 0002 and 0009 (drizzle/), which finished runs are stored under.
  const stored = ['direct_rate', 'direct_lo', 'direct_hi', 'direct_count', 'sparking_rate', 'sparking_lo', 'sparking_hi', 'sparking_count',
    'ignition_rate', 'ignition_lo', 'ignition_hi', 'ignition_count', 'expected_annual_loss', 'expected_annual_loss_lo', 'expected_annual_loss_hi']
  const errors = ['direct_se', 'sparking_se', 'ignition_se', 'expected_annual_loss_se']

  it('declares every figure column under its prefix, with standard errors on site and portfolio rows only', () => {
    for (const t of [runSiteResults, runPortfolioResults]) expect(columnNames(t)).toEqual(expect.arrayContaining([...stored, ...errors]))
    expect(columnNames(runTankResults)).toEqual(expect.arrayContaining(stored))
    expect(columnNames(runTankResults).filter(n => n.endsWith('_se'))).toEqual([])
  })

  it('keeps rates and intervals required and counts nullable (frequency mode has none)', () => {
    const byName = new Map(getTableConfig(runSiteResults).columns.map(c => [c.name, c]))
    expect(byName.get('ignition_rate')!.notNull).toBe(true)
    expect(byName.get('expected_annual_loss_hi')!.notNull).toBe(true)
    expect(byName.get('ignition_count')!.notNull).toBe(false)
    expect(byName.get('expected_annual_loss')!.getSQLType()).toBe('numeric(20, 2)')
  })
})

describe('one figure from the engine to the row and back', () => {
  it('a simulated count keeps its whole count, Garwood interval and Poisson standard error', () => {
    // 0 events in 1,000 years: Garwood (1936) upper limit −ln(0.025) = 3.6889 events, lower 0; SE √0 / Y = 0.
    const zero = figureFromCount({ count: 0, rate: 0, lo: 0, hi: 3.6889 / 1000 }, 1000)
    expect(zero).toEqual({ rate: 0, lo: 0, hi: 3.6889 / 1000, se: 0, count: 0, upperBoundOnly: false })
    // 25 events in 100 years: SE √25 / 100 = 0.05 /yr (Poisson, closed form).
    expect(figureFromCount({ count: 25, rate: 0.25, lo: 0.16, hi: 0.37 }, 100).se).toBeCloseTo(0.05, 15)
  })

  it('an estimate stopped by the negligible-rate rule stays an upper bound; others are not', () => {
    expect(figureFromEstimate({ rate: 1e-7, se: 1e-7, lo: 0, hi: 3e-7, upperBoundOnly: true }).upperBoundOnly).toBe(true)
    expect(figureFromEstimate({ rate: 0.1, se: 0.01, lo: 0.08, hi: 0.12 })).toEqual({ rate: 0.1, se: 0.01, lo: 0.08, hi: 0.12, count: null, upperBoundOnly: false })
  })

  it('writes a figure to its columns and reads it back unchanged (a stored row of any run reads the same)', () => {
    // Invented figures (hand-written): one simulated-years site row.
    const figures = {
      direct: { rate: 0.003, lo: 0.0021, hi: 0.0042, se: 0.00055, count: 30, upperBoundOnly: false },
      sparking: { rate: 0.012, lo: 0.0101, hi: 0.0141, se: 0.0011, count: 120, upperBoundOnly: false },
      ignition: { rate: 0.0004, lo: 0.00013, hi: 0.00093, se: 0.0002, count: 4, upperBoundOnly: false },
      expectedAnnualLoss: { rate: 1234.56, lo: 800.01, hi: 1669.11, se: 221.5, count: null, upperBoundOnly: false },
    }
    const row = figureValues(figures)
    // The flat columns a row of migration 0009's shape holds.
    expect(row).toMatchObject({ directRate: 0.003, directLo: 0.0021, directHi: 0.0042, directCount: 30, directSe: 0.00055, expectedAnnualLoss: 1234.56, expectedAnnualLossLo: 800.01, expectedAnnualLossHi: 1669.11, expectedAnnualLossSe: 221.5 })
    // What a nested select of those columns answers (server/results/figures.ts selectFigures).
    const selected = {
      direct: { rate: row.directRate, lo: row.directLo, hi: row.directHi, count: row.directCount, se: row.directSe },
      sparking: { rate: row.sparkingRate, lo: row.sparkingLo, hi: row.sparkingHi, count: row.sparkingCount, se: row.sparkingSe },
      ignition: { rate: row.ignitionRate, lo: row.ignitionLo, hi: row.ignitionHi, count: row.ignitionCount, se: row.ignitionSe },
      expectedAnnualLoss: { rate: row.expectedAnnualLoss, lo: row.expectedAnnualLossLo, hi: row.expectedAnnualLossHi, se: row.expectedAnnualLossSe },
    }
    expect(toFigures(selected)).toEqual(figures)
  })

  it('a tank row keeps no standard error and marks the figures its negligible-rate list names', () => {
    const f = { rate: 2e-6, lo: 0, hi: 8e-6, se: 1e-6, count: null, upperBoundOnly: true }
    const row = tankFigureValues({ direct: { ...f, upperBoundOnly: false }, sparking: f, ignition: f, expectedAnnualLoss: f })
    expect(Object.keys(row).some(k => k.endsWith('Se'))).toBe(false)
    const read = toFigures({
      direct: { rate: row.directRate, lo: row.directLo, hi: row.directHi, count: row.directCount },
      sparking: { rate: row.sparkingRate, lo: row.sparkingLo, hi: row.sparkingHi, count: row.sparkingCount },
      ignition: { rate: row.ignitionRate, lo: row.ignitionLo, hi: row.ignitionHi, count: row.ignitionCount },
      expectedAnnualLoss: { rate: row.expectedAnnualLoss, lo: row.expectedAnnualLossLo, hi: row.expectedAnnualLossHi },
    }, ['sparking', 'ignition'])
    expect(read.sparking).toEqual({ rate: 2e-6, lo: 0, hi: 8e-6, se: null, count: null, upperBoundOnly: true })
    expect(read.direct.upperBoundOnly).toBe(false)
    expect(read.expectedAnnualLoss.upperBoundOnly).toBe(false)
  })

  it('sums simulated counts as counts, not as rates', () => {
    // 3 + 4 events over the same 10,000 years: 7 events, rate 7e-4 /yr, SE √7 / 10,000 (Poisson, closed form).
    const part = (count: number) => figureFromCount({ count, rate: count / 1e4, lo: 0, hi: 0 }, 1e4)
    const sum = sumCounts([part(3), part(4)], 1e4)
    expect(sum.count).toBe(7)
    expect(sum.rate).toBe(7 / 1e4)
    expect(sum.se).toBeCloseTo(Math.sqrt(7) / 1e4, 18)
  })
})
