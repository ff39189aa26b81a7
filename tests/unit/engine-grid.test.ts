import { describe, expect, it } from 'vitest'
import { toSparkingGrid } from '../../shared/results/engine-grid'

describe('engine heatmap → component grid', () => {
  it('keeps the probabilities and ends the direct-strike zone at the last distance inside it', () => {
    // Hand-made 2 × 3 heatmap (common practice: a small table checked by eye).
    const grid = toSparkingGrid({
      tankId: 't', currentsKa: [10, 100], distancesM: [5, 20, 80],
      sparkingProbability: [[0.9, 0.2, 0], [1, 0.8, 0.3]],
      directShare: [[0.2, 0, 0], [1, 0.7, 0]],
      directZone: [[false, false, false], [true, true, false]],
      ignitionProbability: [[0, 0, 0], [0, 0, 0]],
    })
    expect(grid.probability).toEqual([[0.9, 0.2, 0], [1, 0.8, 0.3]])
    expect(grid.directStrikeDistanceM).toEqual([0, 20])
  })
})
