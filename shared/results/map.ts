// Where the map looks and how big its symbols are.
import { formatCount } from '../format'

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

/** One drawn mark: a single site, or several sites that would overlap at the current zoom. */
export interface MapCluster<T> {
  members: T[]
  /** Mean position of the members, [longitude, latitude]. */
  position: [number, number]
}

/**
 * Greedy declutter: points are taken largest weight first; each joins the first cluster whose centre
 * lies within `radiusPx` on screen (positions scaled by `pxPerDegLon`, `pxPerDegLat`), or starts one.
 * A cluster's centre is its first (heaviest) member's position, so a cluster never creeps across the
 * screen as members join. At a zoom where no two points are that close, every point stays alone.
 */
export function clusterPoints<T extends { latitude: number, longitude: number }>(
  points: readonly T[], weight: (p: T) => number, pxPerDegLon: number, pxPerDegLat: number, radiusPx = 22,
): MapCluster<T>[] {
  const order = points.map((p, k) => ({ p, k, w: weight(p) })).sort((a, b) => (b.w - a.w) || (a.k - b.k))
  const clusters: { anchor: [number, number], members: T[] }[] = []
  for (const { p } of order) {
    const hit = clusters.find(c => Math.hypot((p.longitude - c.anchor[0]) * pxPerDegLon, (p.latitude - c.anchor[1]) * pxPerDegLat) <= radiusPx)
    if (hit) hit.members.push(p)
    else clusters.push({ anchor: [p.longitude, p.latitude], members: [p] })
  }
  return clusters.map(c => ({
    members: c.members,
    position: c.members.length === 1
      ? c.anchor
      : [c.members.reduce((s, m) => s + m.longitude, 0) / c.members.length, c.members.reduce((s, m) => s + m.latitude, 0) / c.members.length],
  }))
}

/** Kilometres per degree of longitude at the equator on the mean Earth sphere (2π · 6371.0088 km / 360). */
export const KM_PER_DEG_EQUATOR = (2 * Math.PI * 6371.0088) / 360

/**
 * A scale bar: the longest round length (1, 2 or 5 × 10ⁿ km) that fits in `maxPx` pixels, for a map
 * drawing `pxPerDegLon` pixels per degree of longitude at latitude `latDeg`.
 */
export function scaleBar(pxPerDegLon: number, latDeg: number, maxPx = 110): { km: number, px: number, label: string } | null {
  const kmPerPx = (KM_PER_DEG_EQUATOR * Math.cos((latDeg * Math.PI) / 180)) / pxPerDegLon
  if (!(kmPerPx > 0) || !Number.isFinite(kmPerPx)) return null
  const maxKm = kmPerPx * maxPx
  const p = 10 ** Math.floor(Math.log10(maxKm))
  const km = [5, 2, 1].map(f => f * p).find(v => v <= maxKm)!
  const label = km >= 1 ? `${formatCount(km)} km` : `${formatCount(Math.round(km * 1000))} m`
  return { km, px: km / kmPerPx, label }
}
