// Storm benchmark (issue 22): 100,000 recorded flashes against 1,000 sites (5,000 tanks) through the
// spatial grid index and the error-integrated kernel, on one thread. Target: ≤ 30 s. Prints its
// figures; run with `npm run bench:storms`.
import { createStream, parseAssumptions } from '../shared/engine/index'
import { computeStormWindow, StormSiteIndex, windowTotals, type StormFlashRecord, type StormSite } from '../shared/storms/compute'
import { generatePortfolio } from './engine-portfolio'
import { timed } from './cpu-time'

const SITES = 1000
const TANKS = 5000
const FLASHES = 100_000
// An invented basin of 3° × 3° (about 330 km × 280 km at 32° N): sites and flashes uniform over it,
// so each flash lands near a site about as often as in a real storm over an oil field.
const REGION = { lat: [30.5, 33.5], lon: [-104, -101] } as const

const line = (label: string, text: string) => console.log(`${label.padEnd(46)} ${text}`)

const assumptions = parseAssumptions({})
const rand = createStream('bench', 'storms', 'layout')
const inputs = generatePortfolio(SITES, TANKS, 'storms')
const sites: StormSite[] = inputs.map(input => ({
  input, latDeg: REGION.lat[0] + rand() * (REGION.lat[1] - REGION.lat[0]), lonDeg: REGION.lon[0] + rand() * (REGION.lon[1] - REGION.lon[0]),
}))
// A few hundred flashes fall on the sites themselves (within 300 m), the rest anywhere in the basin.
const flashes: StormFlashRecord[] = Array.from({ length: FLASHES }, (_, i) => {
  const near = rand() < 0.003
  const site = sites[Math.floor(rand() * SITES)]!
  const latDeg = near ? site.latDeg + (rand() - 0.5) * 0.0054 : REGION.lat[0] + rand() * (REGION.lat[1] - REGION.lat[0])
  const lonDeg = near ? site.lonDeg + (rand() - 0.5) * 0.0064 : REGION.lon[0] + rand() * (REGION.lon[1] - REGION.lon[0])
  const u = Math.min(1 - 1e-9, Math.max(1e-9, rand()))
  const current = 31 * Math.pow((1 - u) / u, 1 / 2.6) // IEEE Std 1410 power law by inversion
  return { id: String(i), latDeg, lonDeg, peakCurrentKa: -Math.min(400, Math.max(2, current)), type: rand() < 0.8 ? 'ground' : 'cloud', locationErrorKm: 0.1 + 0.4 * rand() }
})

console.log(`Storm benchmark: ${FLASHES.toLocaleString('en-GB')} flash records × ${SITES.toLocaleString('en-GB')} sites (${TANKS.toLocaleString('en-GB')} tanks), one thread`)
const built = timed(() => new StormSiteIndex(sites, assumptions))
line('index (prepare sites, grid, reach table)', `${built.cpu.toFixed(2)} s CPU (${built.wall.toFixed(2)} s wall)`)
const run = timed(() => computeStormWindow(built.value, flashes))
const r = run.value
line('window computed', `${run.cpu.toFixed(2)} s CPU (${run.wall.toFixed(2)} s wall) — target ≤ 30 s`)
line('ground flashes / cloud records left out', `${r.groundFlashes.toLocaleString('en-GB')} / ${r.cloudRecordsLeftOut.toLocaleString('en-GB')}`)
line('flash–site pairs after the index', `${r.pairs.toLocaleString('en-GB')} (of ${(r.groundFlashes * SITES).toLocaleString('en-GB')} without it)`)
line('flashes that reached a site', r.flashesNearSites.toLocaleString('en-GB'))
const totals = windowTotals(r)
line('tanks with a probability above 1e-9', r.tanks.length.toLocaleString('en-GB'))
line('expected fires in the window', totals.expectedFires.toFixed(3))
line('highest P(fire) of a tank', (r.tanks[0]?.ignition ?? 0).toFixed(4))
