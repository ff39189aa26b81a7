// Year-loss statistics on a ten-year table worked out by hand here (common practice in catastrophe
// modelling: loss at return period T is the (Y/T)-th largest year; TVaR the mean of the worst Y/T years).
import { describe, expect, it } from 'vitest'
import { combineYearLossTables, lossAtReturnPeriod, sortDescending, summariseYearLosses, tailValueAtRisk } from '../../shared/engine/index'

// Year 2: one event of 50. Year 4: events of 150 and 50. Year 7: events of 600 and 400. Year 9: one of 300.
const yearLosses = Float64Array.from([0, 0, 50, 0, 200, 0, 0, 1000, 0, 300])
const yearMax = Float64Array.from([0, 0, 50, 0, 150, 0, 0, 600, 0, 300])

describe('hand-made ten-year table', () => {
  const s = summariseYearLosses(yearLosses, yearMax, [4, 5, 10, 20])
  const at = (rows: typeof s.aggregate, T: number) => rows.find((r) => r.returnPeriodYears === T)!

  it('average annual loss', () => {
    expect(s.averageAnnualLoss).toBe(155) // (50 + 200 + 1000 + 300) / 10 = 155
    expect(s.lossYearShare).toBe(0.4) // 4 of 10 years have a loss
  })
  it('aggregate losses at return periods 5 and 10', () => {
    expect(at(s.aggregate, 10).loss).toBe(1000) // k = 10/10 = 1: the largest year, 1000
    expect(at(s.aggregate, 5).loss).toBe(300) // k = 10/5 = 2: second largest year, 300
    expect(at(s.aggregate, 4).loss).toBe(250) // k = 2.5: halfway between 300 and 200
    expect(at(s.aggregate, 20).loss).toBeNull() // a 10-year table cannot say what is exceeded once in 20 years
  })
  it('occurrence losses at return periods 5 and 10', () => {
    expect(at(s.occurrence, 10).loss).toBe(600) // largest single event: 600 (year 7)
    expect(at(s.occurrence, 5).loss).toBe(300) // second largest yearly maximum: 300 (year 9)
  })
  it('tail value-at-risk', () => {
    expect(at(s.aggregate, 10).tailValueAtRisk).toBe(1000) // worst 1 year: 1000
    expect(at(s.aggregate, 5).tailValueAtRisk).toBe(650) // worst 2 years: (1000 + 300) / 2
    expect(at(s.aggregate, 4).tailValueAtRisk).toBe(560) // worst 2.5 years: (1000 + 300 + 0.5·200) / 2.5
    expect(at(s.occurrence, 5).tailValueAtRisk).toBe(450) // (600 + 300) / 2
  })
  it('helpers on a full sorted column', () => {
    const sorted = sortDescending(yearLosses)
    expect(Array.from(sorted)).toEqual([1000, 300, 200, 50, 0, 0, 0, 0, 0, 0]) // the table sorted by hand
    expect(lossAtReturnPeriod(sorted, 5)).toBe(300)
    expect(tailValueAtRisk(sorted, 5)).toBe(650)
  })
  it('portfolio: aggregate losses add by year, occurrence takes the largest event', () => {
    const other = { yearLosses: Float64Array.from([10, 0, 0, 0, 0, 0, 0, 0, 0, 700]), yearMaxEventLoss: Float64Array.from([10, 0, 0, 0, 0, 0, 0, 0, 0, 700]) }
    const p = combineYearLossTables([{ yearLosses, yearMaxEventLoss: yearMax }, other])
    expect(Array.from(p.yearLosses)).toEqual([10, 0, 50, 0, 200, 0, 0, 1000, 0, 1000]) // same year index = same simulated year
    expect(Array.from(p.yearMaxEventLoss)).toEqual([10, 0, 50, 0, 150, 0, 0, 600, 0, 700]) // max(300, 700) in year 9
  })
})
