// Event bands (the site heat map's current × distance shares): CPU time over the first sites of the
// engine benchmark's generated portfolio, the runs' stopping rule (RUN_EVENT_BANDS) against a fixed
// count, and how far each site's shares lie from a long reference of 400,000 candidates.
//   npm run bench:event-bands -- [--sites 100] [--fixed 40000] [--reference]
import { loadavg } from 'node:os'
import { parseArgs } from 'node:util'
import { parseAssumptions } from '../shared/engine/assumptions'
import { RUN_EVENT_BANDS, siteEventBands, type SiteEventBands } from '../shared/engine/heatmap'
import { prepareSiteOnce } from '../shared/engine/prepared'
import { generatePortfolio } from './engine-portfolio'
import { timed } from './cpu-time'

const { values } = parseArgs({ options: { sites: { type: 'string', default: '100' }, fixed: { type: 'string', default: '40000' }, reference: { type: 'boolean', default: false } } })
const a = parseAssumptions({})
const sites = generatePortfolio(1000, 5000).slice(0, Number(values.sites))
const prepared = sites.map((s) => prepareSiteOnce(s, a))
prepared.forEach((p) => p.envelope())
const load = () => loadavg().map((l) => l.toFixed(1)).join(' ')
console.log(`load average ${load()}; ${sites.length} sites, ${sites.reduce((n, s) => n + s.tanks.length, 0)} tanks`)
// A warm-up pass, so neither timing below carries the compiler's first work.
sites.slice(0, 10).forEach((s, i) => siteEventBands(s, a, { runSeed: 2, ...RUN_EVENT_BANDS }, prepared[i]))
const fixed = timed(() => sites.map((s, i) => siteEventBands(s, a, { runSeed: 1, samples: Number(values.fixed) }, prepared[i])))
const rule = timed(() => sites.map((s, i) => siteEventBands(s, a, { runSeed: 1, ...RUN_EVENT_BANDS }, prepared[i])))
const p = RUN_EVENT_BANDS.precision!
const samples = rule.value.map((r) => r.samples!)
const mean = (xs: number[]) => xs.reduce((x, y) => x + y, 0) / xs.length
console.log(`fixed ${Number(values.fixed).toLocaleString('en-GB')} candidates: ${fixed.cpu.toFixed(2)} s CPU (${fixed.wall.toFixed(2)} s wall)`)
console.log(`stopping rule (share se ≤ ${p.shareSe}, total rse ≤ ${p.totalRse}, ${p.minSamples.toLocaleString('en-GB')}–${RUN_EVENT_BANDS.samples!.toLocaleString('en-GB')} candidates): ${rule.cpu.toFixed(2)} s CPU (${rule.wall.toFixed(2)} s wall); mean ${mean(samples).toFixed(0)} candidates per site, ${samples.filter((n) => n >= RUN_EVENT_BANDS.samples!).length} at the ceiling; largest stated share se ${Math.max(...rule.value.map((r) => r.largestShareSe!)).toFixed(4)}`)
if (values.reference) {
  const ref = sites.map((s, i) => siteEventBands(s, a, { runSeed: 99, samples: 400_000 }, prepared[i]))
  const deviation = (runs: SiteEventBands[]) => runs.map((b, i) => Math.max(...b.share.flat().map((v, c) => Math.abs(v - ref[i]!.share.flat()[c]!))))
  const quantiles = (d: number[]) => { const s = [...d].sort((x, y) => x - y); return `median ${s[Math.floor(s.length / 2)]!.toFixed(4)}, p90 ${s[Math.floor(s.length * 0.9)]!.toFixed(4)}, max ${s[s.length - 1]!.toFixed(4)}` }
  console.log(`largest |share − 400,000-candidate share| per site — fixed: ${quantiles(deviation(fixed.value))}; stopping rule: ${quantiles(deviation(rule.value))}`)
}
console.log(`load average ${load()} at the end`)
