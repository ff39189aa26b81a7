// The hot path against the closed forms it must reproduce.
import { describe, expect, it } from 'vitest'
import {
  componentSparkingProbability, createStream, inducedPotentialKv, isolatedCaptureRadius, lateralAttractionDistance,
  parseAssumptions, prepareSite, ruskCoupling, strikingDistance,
} from '../../../shared/engine/index'
import {
  attachFlash, createArcScratch, directCaptureFraction, exactSparkProbabilityLn, sparkProbabilityLn, strikeRadius, tankSparkGivenAttachment,
} from '../../../shared/engine/kernel'
import { battery, makeSite, makeTank } from './fixtures'

const a = parseAssumptions({})

describe('attachment', () => {
  it('an isolated tank is struck exactly within its lateral attraction distance D(I) (MODEL.md §2 closed form)', () => {
    const ps = prepareSite(makeSite([makeTank({ heightM: 10, diameterM: 4 })]), a)
    for (const current of [2, 5, 10, 31, 100, 400]) {
      const d = lateralAttractionDistance(current, 10, 2, a)
      const rs = strikingDistance(current, 10, 0.65)
      expect(attachFlash(ps, d - 1e-6, 0, rs)).toBe(0)
      expect(attachFlash(ps, d + 1e-6, 0, rs)).toBe(-1)
    }
  })
  it('a taller structure wins where capture zones overlap', () => {
    const ps = prepareSite(makeSite([makeTank()], [{ id: 'm', kind: 'mast', xM: 10, yM: 0, heightM: 30, radiusM: 0.3 }]), a)
    const rs = strikingDistance(31, 10, 0.65)
    expect(attachFlash(ps, ps.objX[1]! + 1, ps.objY[1]!, rs)).toBe(1) // right above the mast
  })
  it('collection-area rule: within 3H of the edge, the tallest wins (IEC 62305-2)', () => {
    const b = parseAssumptions({ attachmentModel: 'collection_area' })
    const ps = prepareSite(makeSite([makeTank({ heightM: 10, diameterM: 4 })]), b)
    expect(isolatedCaptureRadius('collection_area', 31, 10, 2, b)).toBe(32) // a + 3H
    expect(attachFlash(ps, 31.9, 0, 0)).toBe(0)
    expect(attachFlash(ps, 32.1, 0, 0)).toBe(-1)
  })
  it('the exact share of directions equals a fine sweep of attachFlash around the tank', () => {
    const ps = prepareSite(battery(), a)
    const arcs = createArcScratch(ps)
    let worst = 0
    for (const current of [3, 12, 40, 150]) {
      const rs = strikeRadius(ps, Math.log(current))
      for (let t = 0; t < ps.nTanks; t++) {
        for (const r of [0.5, 3, 8, 15, 30, 60]) {
          const steps = 7200
          let hits = 0
          for (let k = 0; k < steps; k++) {
            const th = 2 * Math.PI * (k + 0.5) / steps
            if (attachFlash(ps, ps.objX[t]! + r * Math.cos(th), ps.objY[t]! + r * Math.sin(th), rs) === t) hits += 1
          }
          worst = Math.max(worst, Math.abs(directCaptureFraction(ps, t, rs, r, arcs) - hits / steps))
        }
      }
    }
    expect(worst).toBeLessThan(1e-3) // a 7200-step sweep resolves shares to ~1/7200 per arc edge
  })
})

describe('induced potential and sparking', () => {
  it('the kernel reproduces Rusk + the log-normal threshold (MODEL.md §3–4)', () => {
    const tank = makeTank({ heightM: 10, diameterM: 4, components: [{ componentClass: 'sharp_device', count: 1, heightM: 8 }] })
    const ps = prepareSite(makeSite([tank]), a)
    for (const [current, y] of [[10, 100], [31, 250], [80, 900], [200, 3000]] as const) {
      const v = inducedPotentialKv(ruskCoupling(1.2e8), current, 8, y, 2)
      const expected = componentSparkingProbability(v, 70, 0.3)
      expect(tankSparkGivenAttachment(ps, 0, current, Math.log(current), -1, y, 0) / expected).toBeCloseTo(1, 5)
    }
  })
  it('n items of a class and several classes combine as independent items', () => {
    const tank = makeTank({ components: [{ componentClass: 'sharp_device', count: 3, heightM: 8 }, { componentClass: 'grounded_pipe', count: 2, heightM: 6 }] })
    const ps = prepareSite(makeSite([tank]), a)
    const kc = ruskCoupling(1.2e8)
    const p1 = componentSparkingProbability(inducedPotentialKv(kc, 40, 8, 300), 70, 0.3)
    const p2 = componentSparkingProbability(inducedPotentialKv(kc, 40, 6, 300), 100, 0.3)
    const expected = 1 - (1 - p1) ** 3 * (1 - p2) ** 2 // issue 5: a class of n items sparks with 1 − (1 − p)^n; the tank if any class does
    expect(exactSparkProbabilityLn(ps, 0, Math.log(40), Math.log(300))).toBeCloseTo(expected, 12)
  })
  it('the tabulated sparking probability matches the exact one to 1e-5 relative', () => {
    const ps = prepareSite(battery(), a)
    const rand = createStream(1, 'table', 'check')
    let worst = 0
    for (let k = 0; k < 50_000; k++) {
      const t = k % ps.nTanks
      const lnI = Math.log(2) + rand() * Math.log(200)
      const lnY = Math.log(10) + rand() * 8
      const exact = exactSparkProbabilityLn(ps, t, lnI, lnY)
      if (exact > 1e-9) worst = Math.max(worst, Math.abs(sparkProbabilityLn(ps, t, lnI, lnY) / exact - 1))
    }
    expect(worst).toBeLessThan(1e-5) // cubic Hermite interpolation, 64 steps per σ (error ~ (z/64)⁴/384)
  })
  it('a shield removes sparking at and below its rating only', () => {
    const ps = prepareSite(makeSite([makeTank({ shieldRatingKa: 50 })]), a)
    expect(tankSparkGivenAttachment(ps, 0, 50, Math.log(50), -1, 100, 0)).toBe(0)
    expect(tankSparkGivenAttachment(ps, 0, 51, Math.log(51), -1, 100, 0)).toBeGreaterThan(0.5)
  })
})
