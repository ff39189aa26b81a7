// Where the map looks and how big its symbols are.

/** The basemap's own extent in degrees (Natural Earth countries, without polar trimming). */
export const WORLD_EXTENT = { west: -180, east: 180, south: -90, north: 84 } as const

export interface MapView {
  /** [longitude, latitude] of the view centre. */
  center: [number, number]
  /** ECharts geo zoom: 1 shows the whole basemap. */
  zoom: number
}

/**
 * Centre and zoom that show every site with a margin: the sites' bounding box, widened by
 * `padding` of its span on each side and to at least `minSpanDeg`, fitted inside the world extent
 * (the basemap is drawn as plain longitude/latitude, so the zoom is the ratio of spans).
 */
export function sitesView(points: readonly { latitude: number, longitude: number }[], padding = 0.2, minSpanDeg = 4, maxZoom = 60): MapView {
  const usable = points.filter((p) => Number.isFinite(p.latitude) && Number.isFinite(p.longitude))
  if (usable.length === 0) return { center: [0, 20], zoom: 1 }
  const lons = usable.map((p) => p.longitude)
  const lats = usable.map((p) => p.latitude)
  const west = Math.min(...lons)
  const east = Math.max(...lons)
  const south = Math.min(...lats)
  const north = Math.max(...lats)
  const lonSpan = Math.max(minSpanDeg, (east - west) * (1 + 2 * padding))
  const latSpan = Math.max(minSpanDeg, (north - south) * (1 + 2 * padding))
  const worldLon = WORLD_EXTENT.east - WORLD_EXTENT.west
  const worldLat = WORLD_EXTENT.north - WORLD_EXTENT.south
  const zoom = Math.min(maxZoom, Math.max(1, Math.min(worldLon / lonSpan, worldLat / latSpan)))
  return { center: [(west + east) / 2, (south + north) / 2], zoom }
}

/**
 * Symbol diameters in pixels growing with the square root of the value (so the symbol's area grows
 * with the value, the usual rule for proportional symbols): the largest value gets maxPx, zero gets
 * minPx. Missing values, or no positive value at all, get the middle size.
 */
export function symbolSizes(values: readonly number[], minPx = 8, maxPx = 30): number[] {
  const positive = values.filter((v) => Number.isFinite(v) && v > 0)
  const max = positive.length > 0 ? Math.max(...positive) : 0
  return values.map((v) => {
    if (!(max > 0) || !Number.isFinite(v)) return (minPx + maxPx) / 2
    const t = Math.sqrt(Math.max(0, v) / max)
    return minPx + (maxPx - minPx) * t
  })
}
