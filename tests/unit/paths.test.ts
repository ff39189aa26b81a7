import { describe, expect, it } from 'vitest'
import { getPath, setPath } from '../../shared/paths'

describe('dotted paths', () => {
  it('reads and writes nested values (common practice)', () => {
    const o = { thresholds: { sharp_device: { u50Kv: 70 } } }
    expect(getPath(o, 'thresholds.sharp_device.u50Kv')).toBe(70)
    expect(getPath(o, 'thresholds.missing.u50Kv')).toBeUndefined()
    expect(setPath({}, 'thresholds.grounded_pipe.sigma', 0.25)).toEqual({ thresholds: { grounded_pipe: { sigma: 0.25 } } })
  })
})
