import { describe, expect, it } from 'vitest'
import { normaliseColumn, normaliseTable, sortRows } from '../../shared/results/heatmap'
import { bandIndex, bandLabels, binEvents, toShares } from '../../shared/results/bands'
import { rankDrivers } from '../../shared/results/drivers'
import { sitesView, symbolSizes, WORLD_EXTENT } from '../../shared/results/map'
import { sampleResults } from '../../shared/results/sample'
import type { SiteMetricRow } from '../../shared/results/types'

const rows: SiteMetricRow[] = [
  { siteId: 'a', siteName: 'Alpha', values: { f: 1e-4, m: 10 } },
  { siteId: 'b', siteName: 'Bravo', values: { f: 1e-2, m: null } },
  { siteId: 'c', siteName: 'Charlie', values: { f: 1e-3, m: 30 } },
]

describe('per-metric normalisation (sites × metrics heatmap)', () => {
  it('maps a column linearly onto [0, 1]', () => {
    // Min–max scaling (x − min)/(max − min): common practice.
    expect(normaliseColumn([10, 20, 30])).toEqual([0, 0.5, 1])
  })

  it('on a log scale puts each decade at an equal step', () => {
    // log10 of 1e-4, 1e-3, 1e-2 is −4, −3, −2: equal steps (arithmetic).
    const t = normaliseColumn([1e-4, 1e-3, 1e-2], true)
    expect(t[0]).toBeCloseTo(0, 12)
    expect(t[1]).toBeCloseTo(0.5, 12)
    expect(t[2]).toBeCloseTo(1, 12)
  })

  it('keeps missing values missing, puts zeros at the bottom of a log column, and centres a constant column', () => {
    // Conventions of this component, chosen here (no outside source): null stays null, 0 → 0, constant → 0.5.
    expect(normaliseColumn([null, 5, 10])).toEqual([null, 0, 1])
    expect(normaliseColumn([0, 1e-3, 1e-1], true)).toEqual([0, 0, 1])
    expect(normaliseColumn([7, 7])).toEqual([0.5, 0.5])
  })

  it('normalises every metric column on its own', () => {
    const t = normaliseTable(rows, [{ key: 'f', label: 'F', format: 'frequency', logScale: true }, { key: 'm', label: 'M', format: 'money' }])
    // f: log10 −4, −2, −3 → 0, 1, 0.5; m: 10, null, 30 → 0, null, 1 (arithmetic).
    expect(t.f!.map((v) => Number(v!.toFixed(12)))).toEqual([0, 1, 0.5])
    expect(t.m).toEqual([0, null, 1])
  })

  it('sorts sites by any metric, missing values last in both directions', () => {
    // Expected orders worked out by hand from the rows above.
    expect(sortRows(rows, 'f', 'desc').map((r) => r.siteId)).toEqual(['b', 'c', 'a'])
    expect(sortRows(rows, 'f', 'asc').map((r) => r.siteId)).toEqual(['a', 'c', 'b'])
    expect(sortRows(rows, 'm', 'desc').map((r) => r.siteId)).toEqual(['c', 'a', 'b'])
    expect(sortRows(rows, 'm', 'asc').map((r) => r.siteId)).toEqual(['a', 'c', 'b'])
  })
})

describe('current and distance bands', () => {
  const edges = [2, 10, 20, 40, Infinity]

  it('labels bands with their unit, an open last band with ≥', () => {
    // House style: ranges with an en dash and the unit (SCREENS.md "Numbers").
    expect(bandLabels(edges, 'kA')).toEqual(['2–10 kA', '10–20 kA', '20–40 kA', '≥ 40 kA'])
    expect(bandLabels([0.5, 1600], 'm')).toEqual(['0.500–1,600 m'])
  })

  it('finds the half-open band [lo, hi) of a value', () => {
    // Half-open intervals: a value on an edge belongs to the band above (common practice for histograms).
    expect(bandIndex(2, edges)).toBe(0)
    expect(bandIndex(9.99, edges)).toBe(0)
    expect(bandIndex(10, edges)).toBe(1)
    expect(bandIndex(1000, edges)).toBe(3)
    expect(bandIndex(1.5, edges)).toBe(-1)
    expect(bandIndex(Number.NaN, edges)).toBe(-1)
  })

  it('sums weighted events into cells and turns them into shares', () => {
    const cells = binEvents([
      { currentKa: 5, distanceM: 10, weight: 2 },
      { currentKa: 15, distanceM: 150 },
      { currentKa: 15, distanceM: 160, weight: 0.5 },
      { currentKa: 1, distanceM: 10 }, // below the first current band: dropped
    ], [2, 10, 20], [0, 100, 200])
    // Hand count: cell (0,0) = 2; cell (1,1) = 1 + 0.5.
    expect(cells).toEqual([[2, 0], [0, 1.5]])
    // Shares of the total 3.5 (arithmetic).
    expect(toShares(cells)).toEqual([[2 / 3.5, 0], [0, 1.5 / 3.5]])
    expect(toShares([[0, 0]])).toEqual([[0, 0]])
  })
})

describe('what drives the total', () => {
  it('ranks by value with shares of the sum, and bars relative to the largest', () => {
    const ranked = rankDrivers([
      { id: 'x', label: 'X', kind: 'tank', value: 1 },
      { id: 'y', label: 'Y', kind: 'tank', value: 3 },
      { id: 'z', label: 'Z', kind: 'tank', value: 6 },
    ], 2)
    // Sum 10: shares 0.6 and 0.3; relative to the largest 6: 1 and 0.5 (arithmetic).
    expect(ranked.map((d) => [d.id, d.rank, d.share, d.relative])).toEqual([['z', 1, 0.6, 1], ['y', 2, 0.3, 0.5]])
  })

  it('takes shares of a given total when the list is only part of it', () => {
    // 6 of a total of 60 is 10 % (arithmetic).
    expect(rankDrivers([{ id: 'z', label: 'Z', kind: 'site', value: 6 }], 10, 60)[0]!.share).toBeCloseTo(0.1, 12)
  })
})

describe('map view and symbol sizes', () => {
  it('centres on the sites and zooms to their padded extent', () => {
    const view = sitesView([{ latitude: 30, longitude: -100 }, { latitude: 34, longitude: -96 }], 0.25)
    // Box 4° × 4°, padded by 25 % a side → 6° × 6°; zoom = min(360/6, 174/6) = 29 (world extent 360° × 174°).
    expect(view.center).toEqual([-98, 32])
    expect(view.zoom).toBeCloseTo((WORLD_EXTENT.north - WORLD_EXTENT.south) / 6, 10)
  })

  it('gives one site a minimum span and no sites the whole world', () => {
    // One site: the 4° minimum span → zoom 174/4 = 43.5 (arithmetic); no site: zoom 1.
    expect(sitesView([{ latitude: 10, longitude: 20 }]).zoom).toBeCloseTo(43.5, 10)
    expect(sitesView([])).toEqual({ center: [0, 20], zoom: 1 })
  })

  it('sizes symbols by the square root of the value (area proportional to value)', () => {
    // Proportional symbols scale the radius with √value (common cartographic practice):
    // √(25/100) = 0.5 → 8 + 22·0.5 = 19 px.
    expect(symbolSizes([100, 25, 0], 8, 30)).toEqual([30, 19, 8])
    expect(symbolSizes([0, 0], 8, 30)).toEqual([19, 19])
  })
})

describe('gallery sample figures', () => {
  it('are the same on every call (fixed seed) and internally ordered', () => {
    const a = sampleResults()
    const b = sampleResults()
    expect(JSON.stringify(a)).toBe(JSON.stringify(b))
    // A loss exceeded less often is at least as large: exceedance curves never fall with return period
    // (definition of an exceedance curve).
    for (const series of a.exceedance) {
      for (let k = 1; k < series.points.length; k++) expect(series.points[k]!.loss).toBeGreaterThanOrEqual(series.points[k - 1]!.loss)
    }
    // The aggregate loss of a year is at least its largest single event (definition).
    const agg = a.exceedance.find((s) => s.kind === 'aggregate')!.points
    const occ = a.exceedance.find((s) => s.kind === 'occurrence')!.points
    agg.forEach((p, k) => expect(p.loss).toBeGreaterThanOrEqual(occ[k]!.loss))
  })
})

describe('what-if parameters', () => {
  it('reads known values from the query and reports the rejected ones', async () => {
    const { paramsFromQuery, defaultWhatIfParams } = await import('../../shared/results/whatif-params')
    const { params, rejected } = paramsFromQuery({ ng: '6.5', height: ['9'], u50: 'abc', sigma: '5', law: 'lognormal' })
    // Values taken from the query above; the rest stay at the defaults.
    expect(params.flashDensity).toBe(6.5)
    expect(params.tankHeightM).toBe(9)
    expect(params.u50Kv).toBe(defaultWhatIfParams.u50Kv)
    expect(params.sigma).toBe(defaultWhatIfParams.sigma)
    expect(params.currentLaw).toBe('lognormal')
    expect(rejected).toHaveLength(2)
    expect(rejected[1]).toContain('between 0 and 1')
  })

  it('round-trips through the query string and lists what changed', async () => {
    const { paramsFromQuery, queryFromParams, changedParams, defaultWhatIfParams } = await import('../../shared/results/whatif-params')
    const changed = { ...defaultWhatIfParams, mastHeightM: 30, shieldKa: 50 }
    const q = queryFromParams(changed)
    // Only differing values go in the query (defaults are implied).
    expect(q).toEqual({ shield: '50', mast: '30' })
    expect(paramsFromQuery(q).params).toEqual(changed)
    expect(changedParams(changed, defaultWhatIfParams).map(c => [c.key, c.from, c.to])).toEqual([['shieldKa', 0, 50], ['mastHeightM', 0, 30]])
  })
})
