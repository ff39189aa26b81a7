import { describe, expect, it } from 'vitest'
import { decodeEvents, encodeEvents, eventBusinessInterruption } from '../../server/runs/events-codec'
import { packEventsEngine1 } from '../support/insurance'

describe('year-mode event packing', () => {
  // A hand-made table (common practice: round-trip test): 3 events, the second hitting two tanks,
  // the second of them by fire spread.
  const table = {
    year: Int32Array.from([4, 17, 17]),
    loss: Float64Array.from([1250.5, 90000, 3.25]),
    tankStart: Int32Array.from([0, 1, 3, 4]),
    tankIndex: Int32Array.from([2, 0, 1, 2]),
    tankLoss: Float64Array.from([1250.5, 60000, 30000, 3.25]),
    split: {
      propertyDamage: Float64Array.from([1000.5, 70000, 3.25]),
      tankPropertyDamage: Float64Array.from([1000.5, 50000, 20000, 3.25]),
      tankBySpread: Uint8Array.from([0, 0, 1, 0]),
    },
  }
  it('gives back exactly the table it was given (odd counts exercise the padding)', () => {
    const back = decodeEvents(encodeEvents(table))
    expect(Array.from(back.year)).toEqual([4, 17, 17])
    expect(Array.from(back.loss)).toEqual([1250.5, 90000, 3.25])
    expect(Array.from(back.tankStart)).toEqual([0, 1, 3, 4])
    expect(Array.from(back.tankIndex)).toEqual([2, 0, 1, 2])
    expect(Array.from(back.tankLoss)).toEqual([1250.5, 60000, 30000, 3.25])
    expect(Array.from(back.split!.propertyDamage)).toEqual([1000.5, 70000, 3.25])
    expect(Array.from(back.split!.tankPropertyDamage)).toEqual([1000.5, 50000, 20000, 3.25])
    expect(Array.from(back.split!.tankBySpread)).toEqual([0, 0, 1, 0])
    // Hand-worked: BI = loss − PD.
    expect(Array.from(eventBusinessInterruption(back)!)).toEqual([250, 20000, 0])
  })

  it('reads events stored by engine 1 (no split) as total only', () => {
    const back = decodeEvents(packEventsEngine1([[4, 1250.5], [17, 90000], [17, 3.25]]))
    expect(Array.from(back.year)).toEqual([4, 17, 17])
    expect(Array.from(back.loss)).toEqual([1250.5, 90000, 3.25])
    expect(Array.from(back.tankLoss)).toEqual([1250.5, 90000, 3.25])
    expect(back.split).toBeNull()
    expect(eventBusinessInterruption(back)).toBeNull()
  })

  it('handles a site with no events and refuses an inconsistent table', () => {
    const empty = {
      year: new Int32Array(0), loss: new Float64Array(0), tankStart: Int32Array.from([0]), tankIndex: new Int32Array(0), tankLoss: new Float64Array(0),
      split: { propertyDamage: new Float64Array(0), tankPropertyDamage: new Float64Array(0), tankBySpread: new Uint8Array(0) },
    }
    expect(decodeEvents(encodeEvents(empty)).year.length).toBe(0)
    expect(() => encodeEvents({ ...empty, loss: Float64Array.from([1]) })).toThrow(/inconsistent/)
  })
})
