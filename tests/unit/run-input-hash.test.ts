// The run's input hash (server/runs/snapshot.ts) covers what decides its results and nothing else:
// the assumptions' uncertainty only with assumption draws, storm clustering only with clustering on.
import { describe, expect, it } from 'vitest'
import { decidingAssumptions, inputHash } from '../../server/runs/snapshot'
import { parseAssumptions } from '../../shared/engine/assumptions'

const base = parseAssumptions({})
const widerU50 = parseAssumptions({
  uncertainty: { entries: [{ path: 'thresholds.sharp_device.u50Kv', distribution: { kind: 'lognormal', median: 70, sigmaLn: 0.5 }, basis: 'analyst', note: '' }], correlations: [] },
})
const otherStorms = parseAssumptions({ stormClustering: { spreadKm: 20, flashesPerStorm: 300 } })

function hash(assumptions: typeof base, options: { assumptionDraws: number, stormClustering: boolean }) {
  return inputHash({ engineVersion: 'test', assumptions: decidingAssumptions(assumptions, options), mode: 'frequency', seed: 1, targetRse: 0.02, maxSamplesPerTank: 1000, years: 100, sites: [] })
}

describe('run input hash', () => {
  it('ignores the uncertainty of a run without draws and counts it in a run with draws', () => {
    expect(widerU50.uncertainty).not.toEqual(base.uncertainty)
    expect(hash(widerU50, { assumptionDraws: 0, stormClustering: false })).toBe(hash(base, { assumptionDraws: 0, stormClustering: false }))
    expect(hash(widerU50, { assumptionDraws: 100, stormClustering: false })).not.toBe(hash(base, { assumptionDraws: 100, stormClustering: false }))
  })
  it('ignores the storm clustering parameters unless clustering is on', () => {
    expect(hash(otherStorms, { assumptionDraws: 0, stormClustering: false })).toBe(hash(base, { assumptionDraws: 0, stormClustering: false }))
    expect(hash(otherStorms, { assumptionDraws: 0, stormClustering: true })).not.toBe(hash(base, { assumptionDraws: 0, stormClustering: true }))
  })
  it('still counts every other assumption', () => {
    const lower = parseAssumptions({ thresholds: { sharp_device: { u50Kv: 60 } } })
    expect(hash(lower, { assumptionDraws: 0, stormClustering: false })).not.toBe(hash(base, { assumptionDraws: 0, stormClustering: false }))
  })
})
