// Per-metric normalisation and sorting for the sites × metrics heatmap: each column is put on
// [0, 1] on its own, so a frequency column and a money column share one colour ramp.
import type { MetricDef, SiteMetricRow } from './types'

/**
 * Min–max normalisation of one column to [0, 1]; on a log scale only positive values take part and
 * zero or negative values map to 0. Null stays null. A column whose values are all equal maps to 0.5.
 */
export function normaliseColumn(values: readonly (number | null)[], logScale = false): (number | null)[] {
  const transform = (v: number) => (logScale ? Math.log10(v) : v)
  const usable = values.filter((v): v is number => v !== null && Number.isFinite(v) && (!logScale || v > 0)).map(transform)
  if (usable.length === 0) return values.map((v) => (v === null ? null : 0))
  const min = Math.min(...usable)
  const max = Math.max(...usable)
  return values.map((v) => {
    if (v === null || !Number.isFinite(v)) return null
    if (logScale && v <= 0) return 0
    if (max === min) return 0.5
    return (transform(v) - min) / (max - min)
  })
}

/** Normalised values of every metric, by metric key, in row order. */
export function normaliseTable(rows: readonly SiteMetricRow[], metrics: readonly MetricDef[]): Record<string, (number | null)[]> {
  return Object.fromEntries(metrics.map((m) => [m.key, normaliseColumn(rows.map((r) => r.values[m.key] ?? null), m.logScale ?? false)]))
}

export type SortDirection = 'asc' | 'desc'

/** Rows sorted by one metric; rows without a value go last whatever the direction; ties by name. */
export function sortRows(rows: readonly SiteMetricRow[], key: string, direction: SortDirection = 'desc'): SiteMetricRow[] {
  const sign = direction === 'desc' ? -1 : 1
  return [...rows].sort((a, b) => {
    const va = a.values[key] ?? null
    const vb = b.values[key] ?? null
    if (va === null && vb === null) return a.siteName.localeCompare(b.siteName)
    if (va === null) return 1
    if (vb === null) return -1
    if (va !== vb) return sign * (va - vb)
    return a.siteName.localeCompare(b.siteName)
  })
}
