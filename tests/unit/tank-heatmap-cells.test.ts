// Every cell the tank heatmap draws, held against the engine's own grid: direct-strike cells are the
// hatched series, every other cell carries the engine's sparking probability.
import { describe, expect, it } from 'vitest'
import { parseAssumptions, tankSparkingHeatmap } from '../../shared/engine/index'
import { toSparkingGrid } from '../../shared/results/engine-grid'
import { tankHeatmapCells } from '../../shared/results/tank-heatmap-cells'
import { sampleResults } from '../../shared/results/sample'
import { makeTank } from './engine/fixtures'

const logSpace = (from: number, to: number, n: number) => Array.from({ length: n }, (_, k) => Number((from * (to / from) ** (k / (n - 1))).toPrecision(3)))

describe('tank heatmap cells', () => {
  const tank = makeTank({ heightM: 8, diameterM: 4 })
  const engine = tankSparkingHeatmap(tank, null, parseAssumptions({}), { currentsKa: [...logSpace(3, 200, 18), 400], distancesM: logSpace(3, 3000, 24) })
  const grid = toSparkingGrid(engine)
  const { sparking, direct } = tankHeatmapCells(grid)

  it('draws each engine cell once, hatched exactly where the engine marks a direct strike', () => {
    expect(sparking.length + direct.length).toBe(engine.currentsKa.length * engine.distancesM.length)
    const hatched = new Set(direct.map(([j, i]) => `${i},${j}`))
    engine.directZone.forEach((row, i) => row.forEach((inside, j) => expect(hatched.has(`${i},${j}`)).toBe(inside)))
    for (const [j, i, v] of sparking) expect(v).toBe(engine.sparkingProbability[i]![j])
  })

  it('leaves no dark "never sparks" column between the hatched zone and the sparking region at 400 kA', () => {
    // Issue "Screens a practitioner reads at a glance": at 400 kA the direct share is 1 inside the
    // attraction distance and sparking is 1 just outside it (the engine's grid).
    const i = engine.currentsKa.indexOf(400)
    const firstOutside = engine.directZone[i]!.findIndex(inside => !inside)
    expect(firstOutside).toBeGreaterThan(0)
    expect(engine.directShare[i]![firstOutside - 1]).toBeGreaterThanOrEqual(0.5)
    const cell = sparking.find(([j, r]) => r === i && j === firstOutside)!
    expect(cell[2]).toBeGreaterThan(0.99)
    expect(sparking.some(([j, r]) => r === i && j === firstOutside - 1)).toBe(false)
  })

  it('in the gallery sample (no engine zone), a cell at the zone edge is hatched too', () => {
    const g = sampleResults().tankGrid
    const { direct: d } = tankHeatmapCells(g)
    for (const [j, i] of d) expect(g.distancesM[j]!).toBeLessThanOrEqual(g.directStrikeDistanceM[i]!)
  })
})
