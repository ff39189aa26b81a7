import { describe, expect, it } from 'vitest'
import { decodeEvents, encodeEvents } from '../../server/runs/events-codec'

describe('year-mode event packing', () => {
  it('gives back exactly the table it was given (odd counts exercise the padding)', () => {
    // A hand-made table (common practice: round-trip test): 3 events, the second hitting two tanks.
    const table = {
      year: Int32Array.from([4, 17, 17]),
      loss: Float64Array.from([1250.5, 90000, 3.25]),
      tankStart: Int32Array.from([0, 1, 3, 4]),
      tankIndex: Int32Array.from([2, 0, 1, 2]),
      tankLoss: Float64Array.from([1250.5, 60000, 30000, 3.25]),
    }
    const back = decodeEvents(encodeEvents(table))
    expect(Array.from(back.year)).toEqual([4, 17, 17])
    expect(Array.from(back.loss)).toEqual([1250.5, 90000, 3.25])
    expect(Array.from(back.tankStart)).toEqual([0, 1, 3, 4])
    expect(Array.from(back.tankIndex)).toEqual([2, 0, 1, 2])
    expect(Array.from(back.tankLoss)).toEqual([1250.5, 60000, 30000, 3.25])
  })

  it('handles a site with no events and refuses an inconsistent table', () => {
    const empty = { year: new Int32Array(0), loss: new Float64Array(0), tankStart: Int32Array.from([0]), tankIndex: new Int32Array(0), tankLoss: new Float64Array(0) }
    expect(decodeEvents(encodeEvents(empty)).year.length).toBe(0)
    expect(() => encodeEvents({ ...empty, loss: Float64Array.from([1]) })).toThrow(/inconsistent/)
  })
})
