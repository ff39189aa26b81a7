// The assumption set: defaults, metadata, merge and validation messages.
import { describe, expect, it } from 'vitest'
import { assumptionParameterMeta, defaultAssumptions, EngineInputError, parseAssumptions, parseSite } from '../../../shared/engine/index'
import { makeSite, makeTank } from './fixtures'

function issuesOf(f: () => unknown): string[] {
  try { f() } catch (e) {
    if (e instanceof EngineInputError) return e.issues
    throw e
  }
  throw new Error('expected an EngineInputError')
}

function leafKeys(value: unknown, prefix = ''): string[] {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) return [prefix]
  return Object.entries(value).flatMap(([k, v]) => leafKeys(v, prefix ? `${prefix}.${k}` : k))
}

describe('defaults and metadata', () => {
  it('the defaults validate', () => {
    expect(parseAssumptions({})).toEqual(defaultAssumptions) // the defaults are a valid set (common practice: defaults must pass their own schema)
  })
  it('metadata lists every parameter once, with its default, unit and source', () => {
    const keys = assumptionParameterMeta.map((m) => m.key)
    expect(new Set(keys).size).toBe(keys.length)
    // `uncertainty` describes parameters (how far each is known); it is not a parameter itself.
    const { uncertainty: _uncertainty, ...parameters } = defaultAssumptions
    expect([...keys].sort()).toEqual(leafKeys(parameters).sort())
    for (const m of assumptionParameterMeta) {
      const value = m.key.split('.').reduce<unknown>((o, k) => (o as Record<string, unknown>)[k], defaultAssumptions)
      expect(m.default).toEqual(value)
      expect(m.source.length).toBeGreaterThan(3)
      expect(m.label.length).toBeGreaterThan(3)
    }
  })
  it('illustrative values say so', () => {
    const u50 = assumptionParameterMeta.find((m) => m.key === 'thresholds.sharp_device.u50Kv')!
    expect(u50.source).toMatch(/illustrative default — calibrate/) // MODEL.md §4: invented demo values are labelled
    expect(u50.unit).toBe('kV')
  })
})

describe('merge over defaults', () => {
  it('a partial set keeps the other defaults, nested ones included', () => {
    const a = parseAssumptions({ thresholds: { sharp_device: { u50Kv: 60 } }, currentLaw: 'lognormal' })
    expect(a.thresholds.sharp_device).toEqual({ u50Kv: 60, sigma: 0.3 })
    expect(a.thresholds.grounded_pipe).toEqual(defaultAssumptions.thresholds.grounded_pipe)
    expect(a.currentLaw).toBe('lognormal')
    expect(a.returnStrokeVelocity).toBe(1.2e8)
  })
})

describe('the validator rejects nonsense with a clear message', () => {
  const cases: [string, unknown, RegExp][] = [
    ['U50 ≤ 0', { thresholds: { sharp_device: { u50Kv: 0 } } }, /thresholds\.sharp_device\.u50Kv: U50 of sharp-edged devices .* must be above 0 kV/],
    ['negative σ', { thresholds: { carbon_fibre: { sigma: -0.1 } } }, /σ of carbon-fibre part must lie between 0/],
    ['velocity ≥ c', { returnStrokeVelocity: 3.1e8 }, /returnStrokeVelocity: return-stroke velocity must be below the speed of light/],
    ['Imin ≥ Imax', { currentMinKa: 500 }, /currentMinKa: Imin \(500 kA\) must be below Imax \(400 kA\)/],
    ['negative Imin', { currentMinKa: -1 }, /Imin must be above 0 kA/],
    ['negative striking-distance coefficient', { strikingDistanceA: -10 }, /striking distance coefficient A must be above 0/],
    ['probability above 1', { ignitionGivenSpark: { crude: 1.5 } }, /ignition given a spark \(crude\) is a probability/],
    ['unknown attachment rule', { attachmentModel: 'cone' }, /attachmentModel must be 'egm' or 'collection_area'/],
    ['empirical law without records', { currentLaw: 'empirical' }, /empirical current law needs at least two recorded currents/],
    ['coupling override ≤ 0', { couplingOverride: 0 }, /coupling override Kc must be above 0/],
    ['not a number', { powerLawExponent: 'steep' }, /power-law exponent must be a number/],
    ['unknown key (a typo)', { retrunStrokeVelocity: 1e8 }, /retrunStrokeVelocity/],
  ]
  for (const [what, input, message] of cases) {
    it(what, () => {
      const issues = issuesOf(() => parseAssumptions(input))
      expect(issues.join('\n')).toMatch(message)
    })
  }
  it('a non-object is refused', () => {
    expect(issuesOf(() => parseAssumptions([1, 2]))).toEqual(['the assumption set must be an object'])
  })
})

describe('site validation', () => {
  it('rejects negative heights, bad counts and duplicate ids with their paths', () => {
    const site = makeSite([
      makeTank({ id: 'x', heightM: -3 }),
      makeTank({ id: 'x', components: [{ componentClass: 'sharp_device', count: 1.5, heightM: 4 }] }),
    ], [{ id: 'm', kind: 'mast', xM: 0, yM: 20, heightM: 0, radiusM: 0.3 }])
    const text = issuesOf(() => parseSite(site)).join('\n')
    expect(text).toMatch(/tanks\.0\.heightM: tank height must be above 0 m/)
    expect(text).toMatch(/tanks\.1\.components\.0\.count: component count must be a whole number/)
    expect(text).toMatch(/structures\.0\.heightM: structure height must be above 0 m/)
    expect(text).toMatch(/tank id 'x' appears twice/)
  })
  it('accepts a valid site unchanged', () => {
    const site = makeSite([makeTank()])
    expect(parseSite(site)).toEqual(site)
  })
})
