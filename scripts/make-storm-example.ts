// Writes examples/storm-feed.csv: an invented thunderstorm over the demo's Dunmere Basin sites, in
// the lightning-record CSV format, for the local fake feed and the browser test. Deterministic: the
// demo inventory's own generator gives the site positions, a fixed seed the flashes.
//   npx tsx scripts/make-storm-example.ts
import { writeFileSync } from 'node:fs'
import { resolve } from 'node:path'
import seedrandom from 'seedrandom'
import { demoSites, DEMO_ORGANISATIONS } from '../server/db/seed/inventory'

const rngInventory = seedrandom('stormledger demo inventory v1')
const sites = demoSites(DEMO_ORGANISATIONS.operatorA.name, 'DBO', 40, 200, { lat: [31.2, 32.9], lon: [101.3, 103.9].map(v => -v).reverse() as [number, number] }, rngInventory, 0, 0.1)
const rng = seedrandom('stormledger example storm v1')
const start = Date.UTC(2026, 5, 14, 21, 5, 0)
const lines = ['time,latitude,longitude,peak_current_ka,type,location_error_km']
const M_PER_DEG = 111_195
function add(latDeg: number, lonDeg: number, minutes: number, currentKa: number, type: string, errorKm: number | null) {
  const t = new Date(start + minutes * 60_000 + Math.floor(rng() * 1000)).toISOString()
  lines.push(`${t},${latDeg.toFixed(5)},${lonDeg.toFixed(5)},${currentKa.toFixed(1)},${type},${errorKm === null ? '' : errorKm.toFixed(2)}`)
}
// Close flashes at three sites: near the tanks, strong, well located.
const hit = [sites[3]!, sites[11]!, sites[27]!]
hit.forEach((s, k) => {
  for (let i = 0; i < 4; i++) {
    const d = 20 + rng() * 120, a = rng() * 2 * Math.PI
    const lat = s.latitudeDeg + (d * Math.sin(a)) / M_PER_DEG
    const lon = s.longitudeDeg + (d * Math.cos(a)) / (M_PER_DEG * Math.cos(s.latitudeDeg * Math.PI / 180))
    add(lat, lon, 5 + k * 12 + i * 2, -(25 + rng() * 60), 'ground', 0.1 + rng() * 0.15)
  }
})
// The storm's other flashes over the basin: mostly far from any tank.
for (let i = 0; i < 240; i++) {
  const lat = 31.4 + rng() * 1.3, lon = -103.6 + rng() * 2.0
  const ground = rng() < 0.7
  add(lat, lon, rng() * 55, (rng() < 0.9 ? -1 : 1) * (5 + 60 * rng() * rng()), ground ? 'ground' : 'cloud', rng() < 0.9 ? 0.1 + rng() * 0.4 : null)
}
lines.sort((x, y) => (x.startsWith('time') ? -1 : y.startsWith('time') ? 1 : x < y ? -1 : 1))
writeFileSync(resolve(import.meta.dirname, '../examples/storm-feed.csv'), `${lines.join('\n')}\n`)
console.log(`examples/storm-feed.csv: ${lines.length - 1} records; close flashes at ${hit.map(s => s.externalId).join(', ')}`)
