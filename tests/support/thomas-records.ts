// Lightning-location records simulated by a Thomas process (shared/calibration/cluster-fit.ts), one
// independent pattern per UTC day inside a latitude/longitude box: the truth a storm clustering
// calibration must recover. Seeded, so every test sees the same records.
import { projectBox, simulateThomas, type ClusterRecord, type LatLonBox } from '../../shared/calibration/cluster-fit'
import { EARTH_MEAN_RADIUS_KM } from '../../shared/calibration/geo'
import { createStream } from '../../shared/engine/random'

export interface ThomasTruth { box: LatLonBox, days: number, stormsPerDay: number, flashesPerStorm: number, spreadKm: number, seed: number }

export function thomasRecords(t: ThomasTruth): ClusterRecord[] {
  const { window } = projectBox(t.box)
  const RAD = Math.PI / 180
  const cos = Math.cos(((t.box.minLat + t.box.maxLat) / 2) * RAD)
  const u = createStream(t.seed, 'test', 'records')
  const kappa = t.stormsPerDay / (window.width * window.height)
  const out: ClusterRecord[] = []
  const day0 = Date.UTC(2024, 5, 1)
  for (let d = 0; d < t.days; d++) {
    for (const p of simulateThomas(u, window, kappa, t.flashesPerStorm, t.spreadKm)) {
      // Spread over the afternoon (12:00–18:00 UTC) of the day: one window per day.
      out.push({ timeMs: day0 + d * 86400e3 + 43200e3 + Math.floor(u() * 21600e3), latDeg: t.box.minLat + p.y / EARTH_MEAN_RADIUS_KM / RAD, lonDeg: t.box.minLon + p.x / EARTH_MEAN_RADIUS_KM / RAD / cos })
    }
  }
  return out
}

/** The same as a records file (one ground flash per line, negative currents). */
export function thomasRecordsCsv(t: ThomasTruth): string {
  const lines = ['time,latitude,longitude,peak_current_ka,type']
  for (const r of thomasRecords(t).sort((a, b) => a.timeMs - b.timeMs)) lines.push(`${new Date(r.timeMs).toISOString()},${r.latDeg.toFixed(5)},${r.lonDeg.toFixed(5)},-30.0,ground`)
  return lines.join('\n') + '\n'
}
