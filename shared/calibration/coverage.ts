// Warnings on a lightning calibration's per-site flash density: records that do not cover the site,
// and a fitted density outside what is plausible for the region.
import { formatNumber } from '../format'
import { EARTH_MEAN_RADIUS_KM, haversineKm } from './geo'

export interface RecordsExtent { latitudeRange: [number, number] | null, longitudeRange: [number, number] | null }

/** Distance (km) from a point to the records' latitude/longitude box; 0 inside it. */
export function distanceToExtentKm(latDeg: number, lonDeg: number, extent: RecordsExtent): number | null {
  if (!extent.latitudeRange || !extent.longitudeRange) return null
  const lat = Math.min(extent.latitudeRange[1], Math.max(extent.latitudeRange[0], latDeg))
  const lon = Math.min(extent.longitudeRange[1], Math.max(extent.longitudeRange[0], lonDeg))
  return haversineKm(latDeg, lonDeg, lat, lon)
}

/** Distance (km) from a point inside the box to the box's nearest edge (how far the box reaches around it). */
function insideMarginKm(latDeg: number, lonDeg: number, extent: RecordsExtent): number {
  const [s, n] = extent.latitudeRange!
  const [w, e] = extent.longitudeRange!
  const kmPerDegLat = (Math.PI / 180) * EARTH_MEAN_RADIUS_KM
  const kmPerDegLon = kmPerDegLat * Math.cos((latDeg * Math.PI) / 180)
  return Math.min((latDeg - s) * kmPerDegLat, (n - latDeg) * kmPerDegLat, (lonDeg - w) * kmPerDegLon, (e - lonDeg) * kmPerDegLon)
}

/**
 * The records do not cover the site when no flash lies within the radius, or when the circle of the
 * radius reaches beyond the records' extent (then Ng counts flashes over part of the circle only
 * and is too low).
 */
export function coverageWarning(site: { name: string, latDeg: number, lonDeg: number }, flashCount: number, radiusKm: number, extent: RecordsExtent | null): string | null {
  const away = extent ? distanceToExtentKm(site.latDeg, site.lonDeg, extent) : null
  if (away !== null && away > 0) {
    return `The records do not cover ${site.name}: it lies ${formatKm(away)} km outside the area they span. Its flash density would be counted from ${flashCount ? 'the edge of the records only' : 'no record'}; do not apply it.`
  }
  if (flashCount === 0) return `No record lies within ${formatKm(radiusKm)} km of ${site.name}: the records do not cover it, or the period is too short. A flash density of 0 is not applied.`
  if (away === 0 && extent) {
    const margin = insideMarginKm(site.latDeg, site.lonDeg, extent)
    if (margin < radiusKm) return `The ${formatKm(radiusKm)} km circle around ${site.name} reaches ${formatKm(radiusKm - margin)} km beyond the area the records span: part of it has no records, so its flash density is too low.`
  }
  return null
}

/**
 * Upper bounds of a plausible ground flash density (flashes/km²/yr) by region. Checked in order;
 * the first region containing the site applies.
 */
export const FLASH_DENSITY_BOUNDS: { region: string, south: number, north: number, west: number, east: number, maxNg: number, source: string }[] = [
  {
    region: 'the contiguous United States', south: 24, north: 50, west: -125, east: -66, maxNg: 20,
    source: 'NLDN cloud-to-ground climatologies peak at about 14–20 flashes/km²/yr over Florida (Holle, Cummins & Brooks 2016; from memory)',
  },
  {
    region: 'latitudes beyond 60°', south: -90, north: -60, west: -180, east: 180, maxNg: 2,
    source: 'satellite lightning climatologies (LIS/OTD) show well under 2 flashes/km²/yr poleward of 60° (Cecil, Buechler & Blakeslee 2014; from memory)',
  },
  {
    region: 'latitudes beyond 60°', south: 60, north: 90, west: -180, east: 180, maxNg: 2,
    source: 'satellite lightning climatologies (LIS/OTD) show well under 2 flashes/km²/yr poleward of 60° (Cecil, Buechler & Blakeslee 2014; from memory)',
  },
  {
    region: 'anywhere on Earth', south: -90, north: 90, west: -180, east: 180, maxNg: 80,
    source: 'the highest total flash rate on Earth, about 230 flashes/km²/yr over Lake Maracaibo (LIS, Albrecht et al. 2016), of which at most about a third reach ground (from memory)',
  },
]

export function flashDensityWarning(site: { name: string, latDeg: number, lonDeg: number }, ng: number): string | null {
  if (!(ng > 0)) return null
  const b = FLASH_DENSITY_BOUNDS.find(r => site.latDeg >= r.south && site.latDeg <= r.north && site.lonDeg >= r.west && site.lonDeg <= r.east)!
  if (ng <= b.maxNg) return null
  return `A flash density of ${formatKm(ng)} flashes/km²/yr at ${site.name} is implausible for ${b.region}: plausible values stay below ${b.maxNg} (${b.source}). Check the detection efficiency, the record period and whether the records are strokes or flashes.`
}

const formatKm = (v: number) => formatNumber(v, 2)
