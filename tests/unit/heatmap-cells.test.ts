// Every heatmap's drawn cells held against the data they come from, and the colour scale chosen by
// the data's span (log once the positive values span two decades).
import { describe, expect, it } from 'vitest'
import { parseAssumptions, tankSparkingHeatmap } from '../../shared/engine/index'
import { toSparkingGrid } from '../../shared/results/engine-grid'
import { tankHeatmapCells } from '../../shared/results/tank-heatmap-cells'
import { eventBandCells, siteMetricCells } from '../../shared/results/heatmap-cells'
import { chooseScale, legendNote } from '../../shared/results/heatmap-scale'
import { sampleMetrics as SITE_METRICS, sampleResults } from '../../shared/results/sample'
import { makeTank } from './engine/fixtures'

describe('chooseScale', () => {
  it('stays linear below a factor of 100 between the positive values and turns log from it', () => {
    const lin = chooseScale([1, 5, 99])
    expect(lin.kind).toBe('linear')
    expect(lin.t(50)).toBeCloseTo(50 / 99, 12) // (v − 0) / (99 − 0), closed form
    const log = chooseScale([0, 1e-6, 1e-3, 1])
    expect(log.kind).toBe('log')
    expect(legendNote(log)).toBe('log scale')
    // log10 between 10⁻⁶ and 1: 10⁻³ sits half way (closed form); 0 at the bottom.
    expect(log.t(1e-3)).toBeCloseTo(0.5, 12)
    expect(log.t(0)).toBe(0)
    expect(log.t(null)).toBeNull()
    expect(chooseScale([1, 100]).kind).toBe('log') // exactly two decades
  })
})

describe('tank sparking heatmap (what-if and site results)', () => {
  const tank = makeTank({ heightM: 8, diameterM: 4 })
  const engine = tankSparkingHeatmap(tank, null, parseAssumptions({}), { currentsKa: [3, 10, 30, 100, 200, 400], distancesM: [3, 10, 30, 100, 300, 1000, 3000] })
  const { sparking, direct, scale } = tankHeatmapCells(toSparkingGrid(engine))
  it('draws each engine cell once: hatched where the engine marks a direct strike, else the engine\'s probability at its place on the scale', () => {
    expect(sparking.length + direct.length).toBe(6 * 7)
    const hatched = new Set(direct.map(([j, i]) => `${i},${j}`))
    engine.directZone.forEach((row, i) => row.forEach((inside, j) => expect(hatched.has(`${i},${j}`)).toBe(inside)))
    for (const [j, i, v, t] of sparking) {
      expect(v).toBe(engine.sparkingProbability[i]![j])
      expect(t).toBe(scale.t(v))
    }
  })
  it('chooses the log scale because the engine\'s probabilities span more than two decades', () => {
    const positive = sparking.map(c => c[2]).filter(v => v > 0)
    expect(Math.max(...positive) / Math.min(...positive)).toBeGreaterThanOrEqual(100)
    expect(scale.kind).toBe('log')
  })
})

describe('event bands heatmap', () => {
  it('gives each band its share of the events (value / total), hand-worked on a small table', () => {
    // Total 200: shares 0.5, 0.25, 0.245, 0.005, 0 (hand-worked); 0.5 / 0.005 = 100 → log scale.
    const bands = { currentEdgesKa: [0, 10, 100], distanceEdgesM: [0, 10, 100, 1000], values: [[100, 50, 0], [49, 1, 0]] }
    const { cells, scale } = eventBandCells(bands)
    expect(cells).toHaveLength(6)
    const at = (i: number, j: number) => cells.find(c => c[0] === j && c[1] === i)!
    expect(at(0, 0)[2]).toBe(0.5)
    expect(at(0, 1)[2]).toBe(0.25)
    expect(at(1, 0)[2]).toBe(0.245)
    expect(at(1, 1)[2]).toBe(0.005)
    expect(scale.kind).toBe('log')
    expect(at(0, 0)[3]).toBe(1)
    expect(at(1, 1)[3]).toBe(0)
    expect(at(0, 2)[3]).toBe(-1) // no events: drawn apart
  })
  it('in the gallery sample, every drawn cell equals the sample\'s share', () => {
    const b = sampleResults().eventBands
    const total = b.values.flat().reduce((a, v) => a + v, 0)
    const { cells } = eventBandCells(b)
    expect(cells).toHaveLength(b.values.length * b.values[0]!.length)
    for (const [j, i, s] of cells) expect(s).toBeCloseTo(b.values[i]![j]! / total, 12)
  })
})

describe('sites × metrics heatmap', () => {
  it('draws each site × metric once with the row\'s own value, each column on its own scale', () => {
    const { rows } = sampleResults()
    const { cells, logColumns } = siteMetricCells(rows, SITE_METRICS)
    expect(cells).toHaveLength(rows.length * SITE_METRICS.length)
    for (const c of cells) expect(c.raw).toBe(rows[c.y]!.values[SITE_METRICS[c.x]!.key] ?? null)
    SITE_METRICS.forEach((m, x) => {
      const values = rows.map(r => r.values[m.key]).filter((v): v is number => typeof v === 'number' && v > 0)
      const spans = values.length >= 2 && Math.max(...values) / Math.min(...values) >= 100
      expect(logColumns.has(m.key), m.key).toBe(spans)
      const column = cells.filter(c => c.x === x && c.raw !== null && c.raw > 0)
      const top = column.reduce((a, c) => (c.raw! > a.raw! ? c : a))
      expect(top.t).toBe(1) // the column's largest value is at the top of the ramp (min–max normalisation)
    })
  })
  it('uses the log scale for a column spanning decades and linear for one that does not', () => {
    const rows = [
      { siteId: 'a', siteName: 'A', values: { f: 1e-4, m: 10 } },
      { siteId: 'b', siteName: 'B', values: { f: 1e-2, m: 20 } },
      { siteId: 'c', siteName: 'C', values: { f: 1, m: 30 } },
    ]
    const { cells, logColumns } = siteMetricCells(rows, [{ key: 'f', label: 'F', format: 'frequency' }, { key: 'm', label: 'M', format: 'money' }])
    expect([...logColumns]).toEqual(['f'])
    // log10: −4, −2, 0 → 0, 0.5, 1; linear 10, 20, 30 → 0, 0.5, 1 (min–max, closed form).
    expect(cells.filter(c => c.x === 0).map(c => c.t)).toEqual([0, 0.5, 1])
    expect(cells.filter(c => c.x === 1).map(c => c.t)).toEqual([0, 0.5, 1])
  })
})
