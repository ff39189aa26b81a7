// "What to calibrate next" (issue "How sure are we"): ranking of sensitivity indices, the sampling-error
// note, and which calibration page estimates which assumption (pages/calibration/).
import { existsSync } from 'node:fs'
import { resolve } from 'node:path'
import { describe, expect, it } from 'vitest'
import { calibrationPageFor, noiseNote, rankIndices, type SensitivityIndex } from '../../shared/results/sensitivity-chart'
import { assumptionParameterMeta } from '../../shared/engine/assumptions'

const idx = (path: string, total: number, totalSe: number, first: number, firstSe: number): SensitivityIndex => ({
  path, label: path, unit: '', totalEffect: { estimate: total, se: totalSe }, firstOrder: { estimate: first, se: firstSe },
})

describe('ranking', () => {
  const result = {
    metric: 'expectedFires' as const, baseSamples: 512,
    indices: [idx('vapourControlFactor', 0.05, 0.03, 0.04, 0.03), idx('thresholds.sharp_device.u50Kv', 0.61, 0.04, 0.52, 0.05), idx('flashDensityFactor', 0.3, 0.02, 0.01, 0.02), idx('b', 0.3, 0.02, 0.2, 0.02)],
  }
  const ranked = rankIndices(result)
  it('by total effect, largest first; ties by first order; ranks from 1', () => {
    expect(ranked.map(r => r.path)).toEqual(['thresholds.sharp_device.u50Kv', 'b', 'flashDensityFactor', 'vapourControlFactor'])
    expect(ranked.map(r => r.rank)).toEqual([1, 2, 3, 4])
  })
  it('does not depend on the order of the input', () => {
    expect(rankIndices({ ...result, indices: [...result.indices].reverse() })).toEqual(ranked)
  })
  it('whiskers at estimate ± 2·se; an estimate within 2·se of 0 is flagged with a readable note', () => {
    const u50 = ranked[0]!
    expect(u50.totalRange[0]).toBeCloseTo(0.53, 12)
    expect(u50.totalRange[1]).toBeCloseTo(0.69, 12)
    expect(u50.totalWithinNoise).toBe(false)
    expect(noiseNote(u50)).toBeNull()
    const vapour = ranked[3]!
    expect(vapour.totalWithinNoise).toBe(true) // 0.05 ≤ 2 × 0.03
    expect(noiseNote(vapour)).toMatch(/total effect of vapourControlFactor is within its sampling error of 0/)
    const flash = ranked[2]!
    expect(flash.totalWithinNoise).toBe(false)
    expect(flash.firstWithinNoise).toBe(true) // 0.01 ≤ 2 × 0.02
    expect(noiseNote(flash)).toMatch(/acts mainly through its interactions/)
  })
})

describe('which calibration page estimates an assumption', () => {
  it('thresholds → impulse tests; current law and flash density → lightning records; others none', () => {
    expect(calibrationPageFor('thresholds.sharp_device.u50Kv')?.to).toBe('/calibration/impulse')
    expect(calibrationPageFor('thresholds.carbon_fibre.sigma')?.to).toBe('/calibration/impulse')
    for (const p of ['lognormalMedianKa', 'lognormalBeta', 'powerLawMedianKa', 'powerLawExponent', 'flashDensityFactor']) expect(calibrationPageFor(p)?.to, p).toBe('/calibration/lightning')
    for (const p of ['vapourControlFactor', 'ignitionGivenSpark.crude', 'returnStrokeVelocity', 'damageRatio.contents.mean', 'fireSpread.decayLengthM']) expect(calibrationPageFor(p), p).toBeNull()
  })
  it('every threshold path of the assumption set maps, and every page it names exists', () => {
    for (const m of assumptionParameterMeta.filter(m => m.key.startsWith('thresholds.'))) expect(calibrationPageFor(m.key), m.key).not.toBeNull()
    for (const to of ['/calibration/impulse', '/calibration/lightning']) expect(existsSync(resolve(import.meta.dirname, `../../pages${to}.vue`)), to).toBe(true)
  })
})
