// Uncertain assumptions against their set (issue "How sure are we"): which paths may be uncertain,
// valid ranges, quantiles of the distributions, illustrative defaults and old stored versions.
import { describe, expect, it } from 'vitest'
import {
  assumptionParameterMeta, defaultAssumptions, distributionQuantile, EngineInputError, FLASH_DENSITY_FACTOR_PATH, ILLUSTRATIVE_UNCERTAINTY,
  parseAssumptions, simulateSiteFrequency, simulateSiteYears, uncertainPathRange, VALUE_COVERAGE, type AssumptionSet, type UncertainAssumption,
} from '../../../shared/engine/index'
import { normalCdf } from '../../../shared/engine/normal'
import { battery } from './fixtures'

function fieldsOf(f: () => unknown): Record<string, string> {
  try { f() } catch (e) {
    if (e instanceof EngineInputError) return e.fields
    throw e
  }
  throw new Error('expected an EngineInputError')
}

const analyst = (path: string, distribution: UncertainAssumption['distribution']): UncertainAssumption => ({ path, distribution, basis: 'analyst', note: '' })
const withEntries = (entries: UncertainAssumption[], correlations: unknown[] = []) => ({ uncertainty: { entries, correlations } })

function valueAt(set: AssumptionSet, path: string): unknown {
  return path.split('.').reduce<unknown>((o, k) => (o as Record<string, unknown>)[k], set)
}

describe('which assumptions may be uncertain', () => {
  it('every numeric assumption of the metadata has a valid range; choices and lists have none', () => {
    for (const m of assumptionParameterMeta) {
      const r = uncertainPathRange(defaultAssumptions, m.key)
      if (m.kind === 'number' || m.kind === 'optional_number') expect(r, m.key).not.toBeNull()
      else expect(r, m.key).toBeNull()
    }
    expect(uncertainPathRange(defaultAssumptions, FLASH_DENSITY_FACTOR_PATH)).toEqual({ min: 0, max: Infinity, minOpen: true, maxOpen: true })
    expect(uncertainPathRange(defaultAssumptions, 'thresholds.steel_roof.u50Kv')).toBeNull()
  })

  it('each valid range agrees with the set schema at its ends (a value just outside is rejected, just inside accepted)', () => {
    for (const m of assumptionParameterMeta.filter(m => m.kind === 'number')) {
      const r = uncertainPathRange(defaultAssumptions, m.key)!
      const setAt = (v: number) => {
        const parts = m.key.split('.')
        const partial: Record<string, unknown> = {}
        let node = partial
        for (const p of parts.slice(0, -1)) node = (node[p] = {}) as Record<string, unknown>
        node[parts.at(-1)!] = v
        // Keep cross-checks (Imin < Imax, cutoff) out of the way of the bound under test.
        return { uncertainty: { entries: [], correlations: [] }, currentMaxKa: m.key === 'currentMinKa' ? 1e9 : undefined, currentMinKa: m.key === 'currentMaxKa' ? 1e-9 : undefined, ...partial }
      }
      const accepts = (v: number) => { try { parseAssumptions(setAt(v)); return true } catch { return false } }
      const eps = (x: number) => Math.max(1e-9, Math.abs(x) * 1e-9)
      if (Number.isFinite(r.min)) {
        expect(accepts(r.min - eps(r.min) * 1e3), `${m.key} below ${r.min}`).toBe(false)
        expect(accepts(r.minOpen ? r.min + eps(r.min) * 1e3 : r.min), `${m.key} at ${r.min}`).toBe(true)
      }
      if (Number.isFinite(r.max) && !m.key.startsWith('damageRatio')) {
        expect(accepts(r.max + eps(r.max) * 1e3), `${m.key} above ${r.max}`).toBe(false)
        expect(accepts(r.maxOpen ? r.max - eps(r.max) * 1e3 : r.max), `${m.key} at ${r.max}`).toBe(true)
      }
    }
  })

  it('a damage ratio mean is bounded by the set\'s standard deviation: sd² < mean·(1 − mean) for a beta on [0, 1]', () => {
    const r = uncertainPathRange(defaultAssumptions, 'damageRatio.cleanup.mean')! // sd 0.3: mean·(1 − mean) > 0.09 ⇔ 0.1 < mean < 0.9 (closed form)
    expect(r.min).toBeCloseTo(0.1, 12)
    expect(r.max).toBeCloseTo(0.9, 12)
    expect(uncertainPathRange(defaultAssumptions, 'damageRatio.contents.sd')!.max).toBeCloseTo(0.4, 12) // √(0.8·0.2) = 0.4
  })
})

describe('quantiles of the distributions (closed forms)', () => {
  it('log-normal: median·exp(σ·z_p)', () => {
    expect(distributionQuantile({ kind: 'lognormal', median: 70, sigmaLn: 0.35 }, 0.975)).toBeCloseTo(70 * Math.exp(0.35 * 1.959964), 3) // z(0.975) = 1.959964 (normal tables)
  })
  it('normal truncated to [0, 1] by the valid range: the quantile of the renormalised CDF', () => {
    const d = { kind: 'normal' as const, mean: 0.9, sd: 0.2 }
    const valid = uncertainPathRange(defaultAssumptions, 'vapourControlFactor')!
    const q = distributionQuantile(d, 0.5, valid)
    // Median m of the normal truncated to [0, 1]: Φ((m−μ)/s) = (Φ(−4.5) + Φ(0.5)) / 2 (definition of truncation).
    expect(normalCdf((q - 0.9) / 0.2)).toBeCloseTo((normalCdf(-4.5) + normalCdf(0.5)) / 2, 7)
    expect(distributionQuantile(d, 0.999999, valid)).toBeLessThanOrEqual(1)
  })
  it('uniform and triangular', () => {
    expect(distributionQuantile({ kind: 'uniform', min: 2, max: 6 }, 0.25)).toBe(3)
    // Triangular (0, 1, 4): F(x) = x²/4 for x ≤ 1 → the 0.1 point is √0.4; F(x) = 1 − (4 − x)²/12 above the mode.
    expect(distributionQuantile({ kind: 'triangular', min: 0, mode: 1, max: 4 }, 0.1)).toBeCloseTo(Math.sqrt(0.4), 12)
    expect(distributionQuantile({ kind: 'triangular', min: 0, mode: 1, max: 4 }, 0.9)).toBeCloseTo(4 - Math.sqrt(1.2), 12)
  })
})

describe('validation against the set, with a message per dotted path', () => {
  it('an unknown path, a choice and a list are refused', () => {
    const f = fieldsOf(() => parseAssumptions(withEntries([
      analyst('thresholds.sharp_device.u50', { kind: 'lognormal', median: 70, sigmaLn: 0.3 }),
      analyst('currentLaw', { kind: 'uniform', min: 0, max: 1 }),
      analyst('empiricalCurrentsKa', { kind: 'uniform', min: 0, max: 1 }),
    ])))
    expect(f['uncertainty.entries.0.path']).toMatch(/thresholds\.sharp_device\.u50 is not a numeric assumption/)
    expect(f['uncertainty.entries.1.path']).toMatch(/currentLaw is not a numeric assumption/)
    expect(f['uncertainty.entries.2.path']).toMatch(/empiricalCurrentsKa is not a numeric assumption/)
  })
  it('a log-normal on a probability is refused (no upper bound); a uniform beyond 1 is refused at its bound', () => {
    const f = fieldsOf(() => parseAssumptions(withEntries([
      analyst('ignitionGivenDirectSteel', { kind: 'lognormal', median: 0.02, sigmaLn: 0.5 }),
      analyst('vapourControlFactor', { kind: 'uniform', min: 0.1, max: 1.2 }),
      analyst('thresholds.carbon_fibre.sigma', { kind: 'triangular', min: -0.1, mode: 0.3, max: 0.5 }),
    ])))
    expect(f['uncertainty.entries.0.distribution.kind']).toMatch(/steel tank.*must stay within \[0, 1\]; a log-normal has no upper bound/)
    expect(f['uncertainty.entries.1.distribution.max']).toMatch(/upper bound of Vapour-control factor.*\(1\.2\) lies outside its valid range \[0, 1\]/)
    expect(f['uncertainty.entries.2.distribution.min']).toMatch(/lower bound of Sparking scatter.*carbon-fibre.*\(-0\.1\) lies outside its valid range \[0, 3\]/)
  })
  it('a normal may not be truncated outside the range, nor keep almost nothing inside it', () => {
    const f = fieldsOf(() => parseAssumptions(withEntries([
      analyst('returnStrokeVelocity', { kind: 'normal', mean: 1.2e8, sd: 3e7, max: 4e8 }),
      analyst('fireSpread.probabilityAtContact', { kind: 'normal', mean: 3, sd: 0.1 }),
    ])))
    expect(f['uncertainty.entries.0.distribution.max']).toMatch(/upper bound of Return-stroke velocity \(4\.000e\+8 m\/s\) lies outside its valid range \(0, 2\.998e\+8\) m\/s/)
    expect(f['uncertainty.entries.1.distribution.mean']).toMatch(/keeps almost nothing inside its bounds/)
  })
  it('the assumption\'s own value must lie inside the distribution\'s 0.1–99.9 % range', () => {
    const f = fieldsOf(() => parseAssumptions(withEntries([analyst('thresholds.sharp_device.u50Kv', { kind: 'lognormal', median: 300, sigmaLn: 0.1 })])))
    expect(f['uncertainty.entries.0.distribution']).toMatch(/does not cover its value 70 kV: its 0\.1–99\.9 % range is 220\.2 to 408\.6 kV/) // 300·exp(∓0.1·3.0902) (z(0.999) = 3.0902)
    expect(() => parseAssumptions(withEntries([analyst('thresholds.sharp_device.u50Kv', { kind: 'lognormal', median: 80, sigmaLn: 0.1 })]))).not.toThrow()
  })
  it('an empty optional value cannot be uncertain; a set one can', () => {
    const f = fieldsOf(() => parseAssumptions(withEntries([analyst('couplingOverride', { kind: 'lognormal', median: 40, sigmaLn: 0.2 })])))
    expect(f['uncertainty.entries.0.path']).toMatch(/Coupling Kc override.*is empty/)
    expect(() => parseAssumptions({ couplingOverride: 40, ...withEntries([analyst('couplingOverride', { kind: 'lognormal', median: 40, sigmaLn: 0.2 })]) })).not.toThrow()
  })
  it('correlations need both ends uncertain (shared schema), ρ strictly inside (−1, 1)', () => {
    const entries = [analyst('thresholds.sharp_device.u50Kv', { kind: 'lognormal', median: 70, sigmaLn: 0.2 })]
    const f = fieldsOf(() => parseAssumptions(withEntries(entries, [{ a: 'thresholds.sharp_device.u50Kv', b: 'thresholds.sharp_device.sigma', rho: 0.5 }, { a: 'thresholds.sharp_device.u50Kv', b: 'x', rho: 1 }])))
    expect(f['uncertainty.correlations.0.b']).toMatch(/is correlated but has no uncertainty/)
    expect(f['uncertainty.correlations.1.rho']).toMatch(/strictly between −1 and 1/)
  })
})

describe('illustrative defaults', () => {
  const entries = ILLUSTRATIVE_UNCERTAINTY.entries
  it('cover the illustrative defaults named by the issue, each labelled and explained', () => {
    const paths = entries.map(e => e.path)
    for (const p of [
      'thresholds.sharp_device.u50Kv', 'thresholds.carbon_fibre.sigma', 'ignitionGivenSpark.crude', 'ignitionGivenDirectNonConducting', 'ignitionGivenDirectSteel',
      'vapourControlFactor', 'damageRatio.replacement.mean', 'fireSpread.probabilityAtContact', 'fireSpread.decayLengthM', 'returnStrokeVelocity',
      'powerLawMedianKa', 'powerLawExponent', FLASH_DENSITY_FACTOR_PATH,
    ]) expect(paths).toContain(p)
    for (const e of entries) {
      expect(e.basis).toBe('illustrative')
      expect(e.note).toMatch(/^illustrative range — calibrate\. .*(From memory|IEC|IEEE|NFPA|CIGRE)/)
    }
  })
  it('each is centred on its default value (median, mean or mode) and validates with the defaults', () => {
    for (const e of entries) {
      const d = e.distribution
      const centre = d.kind === 'lognormal' ? d.median : d.kind === 'normal' ? d.mean : d.kind === 'triangular' ? d.mode : (d.min + d.max) / 2
      expect(centre, e.path).toBe(e.path === FLASH_DENSITY_FACTOR_PATH ? 1 : valueAt(defaultAssumptions, e.path))
    }
    expect(parseAssumptions({}).uncertainty.entries).toHaveLength(entries.length)
  })
  it('an illustrative range goes with its default: change the value and the range (and its correlations) are dropped', () => {
    const a = parseAssumptions({ thresholds: { sharp_device: { u50Kv: 200 } } })
    expect(a.uncertainty.entries.map(e => e.path)).not.toContain('thresholds.sharp_device.u50Kv')
    expect(a.uncertainty.entries).toHaveLength(entries.length - 1)
    const own = parseAssumptions({ thresholds: { sharp_device: { u50Kv: 200 } }, ...withEntries([analyst('thresholds.sharp_device.u50Kv', { kind: 'lognormal', median: 200, sigmaLn: 0.2 })]) })
    expect(own.uncertainty.entries).toEqual([analyst('thresholds.sharp_device.u50Kv', { kind: 'lognormal', median: 200, sigmaLn: 0.2 })])
  })
  it('a stored version from before uncertainty (no `uncertainty` key) reads with the illustrative ranges of the values still at their defaults', () => {
    const { uncertainty: _u, ...old } = structuredClone(defaultAssumptions) as AssumptionSet
    const oldChanged = { ...old, vapourControlFactor: 0.5 }
    const read = parseAssumptions(oldChanged)
    expect(read.uncertainty.entries.map(e => e.path)).not.toContain('vapourControlFactor')
    expect(read.uncertainty.entries).toHaveLength(entries.length - 1)
    expect(read.vapourControlFactor).toBe(0.5)
  })
  it('the default value lies well inside each default range (0.1–99.9 %)', () => {
    for (const e of entries) {
      const valid = uncertainPathRange(defaultAssumptions, e.path)!
      const v = e.path === FLASH_DENSITY_FACTOR_PATH ? 1 : valueAt(defaultAssumptions, e.path) as number
      expect(distributionQuantile(e.distribution, VALUE_COVERAGE.lo, valid), e.path).toBeLessThan(v)
      expect(distributionQuantile(e.distribution, VALUE_COVERAGE.hi, valid), e.path).toBeGreaterThan(v)
    }
  })
  it('they change no run figure: runs without draws ignore the uncertainty (frequency and simulated years)', () => {
    const withRanges = parseAssumptions({})
    const without = parseAssumptions({ uncertainty: { entries: [], correlations: [] } })
    const site = battery()
    expect(JSON.stringify(simulateSiteFrequency(site, withRanges, { runSeed: 11, targetRse: 0.05 })))
      .toBe(JSON.stringify(simulateSiteFrequency(site, without, { runSeed: 11, targetRse: 0.05 })))
    expect(JSON.stringify(simulateSiteYears(site, withRanges, { runSeed: 11, years: 300 })))
      .toBe(JSON.stringify(simulateSiteYears(site, without, { runSeed: 11, years: 300 })))
  })
})
