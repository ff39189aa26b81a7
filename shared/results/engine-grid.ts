// The engine's tank heatmap (shared/engine/heatmap.ts) in the shape the heatmap component draws.
import type { TankHeatmap } from '../engine/heatmap'
import type { TankSparkingGrid } from './types'

/** For each current, the direct-strike zone ends at the largest distance still inside it (0 if none). */
export function toSparkingGrid(h: TankHeatmap): TankSparkingGrid {
  return {
    currentsKa: h.currentsKa,
    distancesM: h.distancesM,
    probability: h.sparkingProbability,
    directZone: h.directZone,
    directStrikeDistanceM: h.directZone.map((row) => {
      let last = -1
      row.forEach((inside, j) => { if (inside) last = j })
      return last >= 0 ? h.distancesM[last]! : 0
    }),
  }
}
