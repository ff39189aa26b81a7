// Year mode: the year-loss table, the event list and their bookkeeping.
import { describe, expect, it } from 'vitest'
import { createStream, parseAssumptions, prepareSite, rollUpYears, simulateSiteYears, summariseYearLosses } from '../../../shared/engine/index'
import { attachFlash, siteEventProbabilities, strikeRadius } from '../../../shared/engine/kernel'
import { buildEnvelope, cellBoundOf, drawCandidate } from '../../../shared/engine/envelope'
import { battery, makeSite, makeTank } from './fixtures'

const a = parseAssumptions({})
const years = 5000
const r = simulateSiteYears(battery(), a, { runSeed: 9, years })

describe('events and year losses', () => {
  it('events are in year order and add up to the year losses', () => {
    const sums = new Float64Array(years)
    for (let e = 0; e < r.events.year.length; e++) {
      if (e > 0) expect(r.events.year[e]!).toBeGreaterThanOrEqual(r.events.year[e - 1]!)
      sums[r.events.year[e]!]! += r.events.loss[e]!
      expect(r.events.loss[e]!).toBeLessThanOrEqual(r.yearMaxEventLoss[r.events.year[e]!]! + 1e-9)
    }
    sums.forEach((s, y) => expect(s).toBeCloseTo(r.yearLosses[y]!, 6))
  })
  it('each event lists its tanks with their own losses', () => {
    const ignitions = new Array(r.tanks.length).fill(0)
    const bySpread = new Array(r.tanks.length).fill(0)
    for (let e = 0; e < r.events.year.length; e++) {
      const from = r.events.tankStart[e]!
      const to = r.events.tankStart[e + 1]!
      expect(to - from).toBe(r.events.tankCount[e])
      let total = 0
      for (let k = from; k < to; k++) {
        total += r.events.tankLoss[k]!
        if (r.events.tankBySpread[k] === 1) bySpread[r.events.tankIndex[k]!] += 1
        else ignitions[r.events.tankIndex[k]!] += 1
      }
      expect(total).toBeCloseTo(r.events.loss[e]!, 6)
    }
    // Ignitions count the flash's own; tanks set alight by a neighbour's fire are counted apart.
    r.tanks.forEach((t, i) => { expect(t.ignition.count).toBe(ignitions[i]); expect(t.spreadIgnitions).toBe(bySpread[i]) })
  })
  it('one flash can involve several tanks of the site', () => {
    expect(Math.max(...Array.from(r.events.tankCount))).toBeGreaterThan(1)
  })
  it('the summary is the summary of the table; totals are the sums of the tanks', () => {
    expect(r.summary).toEqual(summariseYearLosses(r.yearLosses, r.yearMaxEventLoss))
    expect(r.totals.sparking.count).toBe(r.tanks.reduce((n, t) => n + t.sparking.count, 0))
    expect(r.summary.averageAnnualLoss).toBeCloseTo(r.tanks.reduce((s, t) => s + t.averageAnnualLoss.mean, 0), 3)
  })
  it('counts carry Garwood intervals around count / years', () => {
    for (const t of r.tanks) {
      expect(t.sparking.rate).toBe(t.sparking.count / years)
      expect(t.sparking.lo).toBeLessThanOrEqual(t.sparking.rate)
      expect(t.sparking.hi).toBeGreaterThan(t.sparking.rate)
    }
  })
  it('a portfolio adds sites year by year', () => {
    const other = simulateSiteYears({ ...battery(), id: 'other' }, a, { runSeed: 9, years })
    const p = rollUpYears([r, other])
    expect(p.yearLosses[17]).toBeCloseTo(r.yearLosses[17]! + other.yearLosses[17]!, 9)
    expect(p.summary.averageAnnualLoss).toBeCloseTo(r.summary.averageAnnualLoss + other.summary.averageAnnualLoss, 3)
  })
  it('rejects a nonsensical number of years', () => {
    expect(() => simulateSiteYears(battery(), a, { runSeed: 1, years: 0 })).toThrow(/years must be a whole number/)
  })
})

describe('thinning envelope', () => {
  it('its bound is never below the event probability of a candidate (exact thinning needs q ≥ P)', () => {
    for (const site of [battery(), makeSite([makeTank({ shieldRatingKa: 40 }), makeTank({ id: 't2', xM: 9, heightM: 5, material: 'steel' })])]) {
      const ps = prepareSite(site, a)
      const env = buildEnvelope(ps)
      const rand = createStream(2, site.id, 'bound-check')
      const flash = { x: 0, y: 0, currentKa: 0, lnI: 0, cell: 0 }
      const p = new Float64Array(ps.nTanks)
      let worst = 0
      for (let k = 0; k < 100_000; k++) {
        drawCandidate(ps, env, rand, flash)
        const attached = attachFlash(ps, flash.x, flash.y, strikeRadius(ps, flash.lnI))
        const any = 1 - siteEventProbabilities(ps, flash.currentKa, flash.lnI, attached, flash.x, flash.y, p)
        worst = Math.max(worst, any / cellBoundOf(env, flash.cell))
      }
      expect(worst).toBeLessThanOrEqual(1 + 1e-6)
    }
  })
})
