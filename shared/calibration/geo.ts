// Great-circle distance between two points given in decimal degrees (WGS 84 latitude/longitude).

/** Mean Earth radius R1 = 6371.0088 km (IUGG; Moritz 2000, Geodetic Reference System 1980). */
export const EARTH_MEAN_RADIUS_KM = 6371.0088

const RAD = Math.PI / 180

/**
 * Haversine formula (Sinnott 1984, "Virtues of the haversine", Sky & Telescope 68(2):159) on a
 * sphere of the mean radius. Within 0.5 % of the ellipsoidal distance, far below the location
 * error of lightning-location networks (hundreds of metres).
 */
export function haversineKm(lat1Deg: number, lon1Deg: number, lat2Deg: number, lon2Deg: number): number {
  const dLat = (lat2Deg - lat1Deg) * RAD
  const dLon = (lon2Deg - lon1Deg) * RAD
  const s = Math.sin(dLat / 2) ** 2 + Math.cos(lat1Deg * RAD) * Math.cos(lat2Deg * RAD) * Math.sin(dLon / 2) ** 2
  return 2 * EARTH_MEAN_RADIUS_KM * Math.asin(Math.min(1, Math.sqrt(s)))
}

/**
 * A latitude/longitude box that contains every point within `radiusKm` of the centre — a cheap
 * pre-filter before the exact distance, so millions of records pass quickly.
 */
export function boundingBox(latDeg: number, lonDeg: number, radiusKm: number): { minLat: number, maxLat: number, minLon: number, maxLon: number, wrapsLon: boolean } {
  const dLat = radiusKm / EARTH_MEAN_RADIUS_KM / RAD
  const minLat = latDeg - dLat
  const maxLat = latDeg + dLat
  if (minLat <= -90 || maxLat >= 90) return { minLat: Math.max(-90, minLat), maxLat: Math.min(90, maxLat), minLon: -180, maxLon: 180, wrapsLon: false }
  const dLon = Math.asin(Math.min(1, Math.sin(radiusKm / EARTH_MEAN_RADIUS_KM) / Math.cos(latDeg * RAD))) / RAD
  const minLon = lonDeg - dLon
  const maxLon = lonDeg + dLon
  return { minLat, maxLat, minLon, maxLon, wrapsLon: minLon < -180 || maxLon > 180 }
}

export function insideBox(box: ReturnType<typeof boundingBox>, latDeg: number, lonDeg: number): boolean {
  if (latDeg < box.minLat || latDeg > box.maxLat) return false
  if (!box.wrapsLon) return lonDeg >= box.minLon && lonDeg <= box.maxLon
  // The box crosses the ±180° meridian: compare on the shifted circle.
  const shifted = lonDeg < box.minLon ? lonDeg + 360 : lonDeg > box.maxLon ? lonDeg - 360 : lonDeg
  return shifted >= box.minLon && shifted <= box.maxLon
}
