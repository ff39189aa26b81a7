// Accumulation and storm clustering benchmark (issue 21): the accumulation view's computation for
// 1,000 sites × 100,000 simulated years (events packed and decoded as a run stores them), and one
// storm clustering calibration on a year of records. Prints its figures; `npm run bench:accumulation`.
import { accumulation } from '../shared/results/accumulation'
import { fitStormClustering } from '../shared/calibration/cluster-fit'
import { createStream } from '../shared/engine/random'
import { decodeEvents, encodeEvents } from '../server/runs/events-codec'
import { thomasRecords } from '../tests/support/thomas-records'

const SITES = 1000
const YEARS = 100_000
const line = (label: string, text: string) => console.log(`${label.padEnd(52)} ${text}`)
function timed<T>(f: () => T): { value: T, seconds: number } {
  const t = performance.now()
  const value = f()
  return { value, seconds: (performance.now() - t) / 1000 }
}

// Sites in 50 regions; a region's bad year (1 %) strikes its sites together, besides each site's own
// independent losses (2 % of years): the shape storm clustering gives a run.
const u = createStream('bench', 'accumulation', 'events')
const regionBad = Array.from({ length: 50 }, () => new Set(Array.from({ length: YEARS }, (_, y) => y).filter(() => u() < 0.01)))
const blobs = Array.from({ length: SITES }, (_, i) => {
  const years: number[] = []
  const losses: number[] = []
  const bad = regionBad[i % 50]!
  for (let y = 0; y < YEARS; y++) {
    if (bad.has(y) && u() < 0.8) { years.push(y); losses.push(1e6 * (1 + u())) } else if (u() < 0.02) { years.push(y); losses.push(1e5 * u()) }
  }
  const n = years.length
  const pd = Float64Array.from(losses)
  return encodeEvents({ year: Int32Array.from(years), loss: Float64Array.from(losses), tankStart: Int32Array.from({ length: n + 1 }, (_, k) => k), tankIndex: new Int32Array(n), tankLoss: pd, split: { propertyDamage: pd, tankPropertyDamage: pd, tankBySpread: new Uint8Array(n) } })
})
const events = blobs.reduce((a, b) => a + b.readUInt32LE(8), 0)
line('Sites × simulated years', `${SITES} × ${YEARS.toLocaleString('en-GB')} (${events.toLocaleString('en-GB')} loss events)`)
const decode = timed(() => blobs.map((b, i) => { const e = decodeEvents(b); return { siteId: `site-${String(i).padStart(4, '0')}`, year: e.year, loss: e.loss } }))
line('Decode the packed events', `${decode.seconds.toFixed(2)} s`)
const acc = timed(() => accumulation(YEARS, decode.value))
line('Accumulation (worst 1 %, shares, co-loss groups)', `${acc.seconds.toFixed(2)} s — ${acc.value.worstYears.length} worst years, ${acc.value.groups.length} groups`)

// Calibration: 365 days of a Thomas process (4 storms a day, 150 flashes each, σ 8 km) in a 300 km box.
const box = { minLat: 30, maxLat: 32.7, minLon: -97, maxLon: -93.9 }
const records = thomasRecords({ box, days: 365, stormsPerDay: 4, flashesPerStorm: 150, spreadKm: 8, seed: 1 })
for (const bootstrap of [0, 49]) {
  const fit = timed(() => fitStormClustering(records, { box, windowHours: 24, detectionEfficiency: 1, periodYears: 1, bootstrap, seed: 'bench' }))
  line(`Storm clustering fit, ${records.length.toLocaleString('en-GB')} flashes, ${bootstrap} bootstrap refits`, `${fit.seconds.toFixed(2)} s — σ ${fit.value.spreadKm.toFixed(2)} km, μ ${fit.value.flashesPerStorm.toFixed(1)}`)
}

// Honesty of the intervals: over 20 simulated record sets (60 days, 4 storms a day, σ 8 km, μ 150),
// how often the 95 % bootstrap interval holds the truth, and the spread of the estimates.
const truth = { spreadKm: 8, flashesPerStorm: 150 }
let coveredSigma = 0, coveredMu = 0
const sigmas: number[] = [], mus: number[] = []
const SETS = 20
const coverage = timed(() => {
  for (let seed = 100; seed < 100 + SETS; seed++) {
    const recs = thomasRecords({ box, days: 60, stormsPerDay: 4, ...truth, seed })
    const r = fitStormClustering(recs, { box, windowHours: 24, detectionEfficiency: 1, periodYears: 60 / 365.25, bootstrap: 39, seed: `coverage ${seed}` })
    sigmas.push(r.spreadKm); mus.push(r.flashesPerStorm)
    if (r.intervals && r.intervals.spreadKm.lo <= truth.spreadKm && truth.spreadKm <= r.intervals.spreadKm.hi) coveredSigma++
    if (r.intervals && r.intervals.flashesPerStorm.lo <= truth.flashesPerStorm && truth.flashesPerStorm <= r.intervals.flashesPerStorm.hi) coveredMu++
  }
})
const meanSd = (xs: number[]) => { const m = xs.reduce((a, x) => a + x, 0) / xs.length; return `mean ${m.toFixed(2)}, sd ${Math.sqrt(xs.reduce((a, x) => a + (x - m) ** 2, 0) / (xs.length - 1)).toFixed(2)}` }
line(`Bootstrap interval coverage, ${SETS} record sets`, `σ ${coveredSigma}/${SETS}, μ ${coveredMu}/${SETS} (${coverage.seconds.toFixed(1)} s)`)
line('Estimates over the record sets (truth σ 8 km, μ 150)', `σ ${meanSd(sigmas)} km; μ ${meanSd(mus)}`)
