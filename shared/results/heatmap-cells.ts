// The cells each heatmap draws, as pure functions of the data, so a test can hold every drawn cell
// against the engine's grid or the figures it came from (issue: cells misplaced against their data).
import type { EventBands, MetricDef, SiteMetricRow } from './types'
import { toShares } from './bands'
import { normaliseColumn } from './heatmap'
import { chooseScale, type ColourScale } from './heatmap-scale'

/** [column, row, value, colour position] as ECharts' heatmap takes them (the visual map reads dimension 3). */
export type ScaledCell = [number, number, number, number]

/**
 * Event bands: one cell per current band (row i) × distance band (column j) with the share of events;
 * a band without events has colour position −1 (drawn apart, as "no events").
 */
export function eventBandCells(bands: EventBands): { cells: ScaledCell[], scale: ColourScale } {
  const shares = toShares(bands.values)
  const scale = chooseScale(shares.flat().filter(s => s > 0))
  const cells: ScaledCell[] = shares.flatMap((row, i) => row.map((s, j) => [j, i, s, s > 0 ? scale.t(s) ?? 0 : -1] as ScaledCell))
  return { cells, scale }
}

/** A site × metric cell: column x (metric), row y (site), colour position t within its column (null: no value), raw value. */
export interface SiteMetricCell { x: number, y: number, t: number | null, raw: number | null }

/**
 * Sites × metrics: each column on its own scale, a log one when the column's positive values span
 * two decades or more (`logColumns`).
 */
export function siteMetricCells(rows: readonly SiteMetricRow[], metrics: readonly MetricDef[]): { cells: SiteMetricCell[], logColumns: Set<string> } {
  const logColumns = new Set<string>()
  const columns = metrics.map((m) => {
    const values = rows.map(r => r.values[m.key] ?? null)
    const log = chooseScale(values).kind === 'log'
    if (log) logColumns.add(m.key)
    return normaliseColumn(values, log)
  })
  const cells = rows.flatMap((r, y) => metrics.map((m, x) => ({ x, y, t: columns[x]![y] ?? null, raw: r.values[m.key] ?? null })))
  return { cells, logColumns }
}
