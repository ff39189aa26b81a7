// Which cells of a tank's current × distance heatmap are drawn as "struck directly" (hatched) and
// which carry a sparking probability. One pure function, so a test can hold every cell against the
// engine's grid (issue: a column of direct-strike cells drawn as "never sparks").
import type { TankSparkingGrid } from './types'
import { chooseScale, type ColourScale } from './heatmap-scale'

/** [distance index, current index, value, colour position] as ECharts' heatmap takes them. */
export type HeatmapCell = [number, number, number, number]

/** True when flashes of current i landing at distance j strike the tank itself. */
export function isDirectCell(g: TankSparkingGrid, i: number, j: number): boolean {
  if (g.directZone) return g.directZone[i]?.[j] ?? false
  // Without the zone itself, directStrikeDistanceM[i] is the farthest grid distance still inside it: inclusive.
  return (g.distancesM[j] ?? Infinity) <= (g.directStrikeDistanceM[i] ?? 0) && (g.directStrikeDistanceM[i] ?? 0) > 0
}

/**
 * The sparking cells carry the engine's probability and its place on the colour scale (log when the
 * probabilities outside the direct zone span two decades or more); direct-strike cells are hatched.
 */
export function tankHeatmapCells(g: TankSparkingGrid): { sparking: HeatmapCell[], direct: HeatmapCell[], scale: ColourScale } {
  const raw: [number, number, number][] = []
  const direct: HeatmapCell[] = []
  g.currentsKa.forEach((_, i) => g.distancesM.forEach((_d, j) => {
    if (isDirectCell(g, i, j)) direct.push([j, i, 1, 1])
    else raw.push([j, i, g.probability[i]![j]!])
  }))
  const scale = chooseScale(raw.map(c => c[2]))
  const sparking = raw.map(([j, i, v]) => [j, i, v, scale.t(v) ?? 0] as HeatmapCell)
  return { sparking, direct, scale }
}
