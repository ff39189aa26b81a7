// Bands of stroke current and distance: labels, lookup and shares (event-band heatmap).
import { formatNumber } from '../format'

/** A band edge: whole numbers as they are ("1,600"), others to three significant figures. */
const edge = (v: number) => (Number.isInteger(v) ? v.toLocaleString('en-GB') : formatNumber(v, 3))

/** "10–20 kA" for each band between consecutive edges; an infinite last edge gives "≥ 200 kA". */
export function bandLabels(edges: readonly number[], unit: string): string[] {
  const labels: string[] = []
  for (let i = 0; i + 1 < edges.length; i++) {
    const lo = edges[i]!
    const hi = edges[i + 1]!
    labels.push(Number.isFinite(hi) ? `${edge(lo)}–${edge(hi)} ${unit}` : `≥ ${edge(lo)} ${unit}`)
  }
  return labels
}

/** Index of the band [edges[i], edges[i+1]) holding value, or −1 outside all bands. */
export function bandIndex(value: number, edges: readonly number[]): number {
  if (!(value >= edges[0]!) || !(value < edges[edges.length - 1]!)) return -1
  let lo = 0
  let hi = edges.length - 1
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1
    if (value >= edges[mid]!) lo = mid
    else hi = mid
  }
  return lo
}

/** Weighted events summed into current band × distance band cells; events outside every band are dropped. */
export function binEvents(
  events: readonly { currentKa: number, distanceM: number, weight?: number }[],
  currentEdgesKa: readonly number[],
  distanceEdgesM: readonly number[],
): number[][] {
  const cells = Array.from({ length: currentEdgesKa.length - 1 }, () => new Array<number>(distanceEdgesM.length - 1).fill(0))
  for (const e of events) {
    const i = bandIndex(e.currentKa, currentEdgesKa)
    const j = bandIndex(e.distanceM, distanceEdgesM)
    if (i >= 0 && j >= 0) cells[i]![j]! += e.weight ?? 1
  }
  return cells
}

/** Each cell as a share of the matrix total (all zeros when the total is 0). */
export function toShares(values: readonly (readonly number[])[]): number[][] {
  const total = values.reduce((s, row) => s + row.reduce((a, v) => a + v, 0), 0)
  return values.map((row) => row.map((v) => (total > 0 ? v / total : 0)))
}
