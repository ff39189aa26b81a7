// Which cells of a tank's current × distance heatmap are drawn as "struck directly" (hatched) and
// which carry a sparking probability. One pure function, so a test can hold every cell against the
// engine's grid (issue: a column of direct-strike cells drawn as "never sparks").
import type { TankSparkingGrid } from './types'

/** [distance index, current index, value] as ECharts' heatmap takes them. */
export type HeatmapCell = [number, number, number]

/** True when flashes of current i landing at distance j strike the tank itself. */
export function isDirectCell(g: TankSparkingGrid, i: number, j: number): boolean {
  if (g.directZone) return g.directZone[i]?.[j] ?? false
  // Without the zone itself, directStrikeDistanceM[i] is the farthest grid distance still inside it: inclusive.
  return (g.distancesM[j] ?? Infinity) <= (g.directStrikeDistanceM[i] ?? 0) && (g.directStrikeDistanceM[i] ?? 0) > 0
}

export function tankHeatmapCells(g: TankSparkingGrid): { sparking: HeatmapCell[], direct: HeatmapCell[] } {
  const sparking: HeatmapCell[] = []
  const direct: HeatmapCell[] = []
  g.currentsKa.forEach((_, i) => g.distancesM.forEach((_d, j) => {
    if (isDirectCell(g, i, j)) direct.push([j, i, 1])
    else sparking.push([j, i, g.probability[i]![j]!])
  }))
  return { sparking, direct }
}
