// Risk-engine benchmark (issue 5). Prints its figures; run with `npx tsx bench/engine.ts`
// (the lead wires `npm run bench:engine`). Times are CPU seconds of this single-threaded process
// (wall time beside them), so a busy machine inflates them less.
import {
  createStream, evaluateFlashes, isolatedTankQuadrature, parseAssumptions, prepareSite, rollUpYears, siteRadius,
  simulateSiteFrequency, simulateSiteYears, clusteringFrame, siteClustering,
} from '../shared/engine/index'
import type { AssumptionSet, PreparedSite, SiteInput } from '../shared/engine/index'
import { crudeTankEstimate, estimateTank } from '../shared/engine/frequency'
import { generatePortfolio } from './engine-portfolio'
import { timed } from './cpu-time'

const SITES = 1000
const TANKS = 5000
const YEARS = 100_000
const TARGET_RSE = 0.02

const fmt = (x: number, digits = 1) => x.toFixed(digits)
const line = (label: string, text: string) => console.log(`${label.padEnd(44)} ${text}`)

/** Flashes within 600 m of each site (where tanks are struck or spark), generated before timing. */
function kernelBench(prepared: PreparedSite[]): void {
  const rand = createStream('bench', 'kernel', 'flashes')
  const perSite = 4000
  const batches = prepared.map((ps) => {
    const x = new Float64Array(perSite), y = new Float64Array(perSite), current = new Float64Array(perSite)
    for (let i = 0; i < perSite; i++) {
      const r = 600 * Math.sqrt(rand()), theta = 2 * Math.PI * rand()
      x[i] = r * Math.cos(theta); y[i] = r * Math.sin(theta); current[i] = ps.law.quantile(rand())
    }
    return { x, y, current, out: new Float64Array(2 * ps.nTanks), scratch: new Float64Array(ps.nTanks) }
  })
  const pass = () => prepared.reduce((n, ps, k) => { const b = batches[k]!; return n + evaluateFlashes(ps, b.x, b.y, b.current, b.out, b.scratch) }, 0)
  pass() // warm-up: let the JIT settle
  const heapBefore = process.memoryUsage().heapUsed
  const run = timed(() => pass() + pass() + pass())
  const heapGrowth = process.memoryUsage().heapUsed - heapBefore
  line('kernel: flash–tank evaluations', `${(run.value / 1e6).toFixed(1)} M in ${fmt(run.cpu, 2)} s CPU`)
  line('kernel: rate per core', `${fmt(run.value / run.cpu / 1e6)} M evaluations/s (target ≥ 10)`)
  line('kernel: heap change over the timed passes', `${(heapGrowth / 1024).toFixed(0)} KiB (the loop creates no objects; negative = earlier garbage collected)`)
}

/**
 * Variance reduction: per tank, samples that crude Monte Carlo (uniform on the site disc, same
 * conditional probabilities) needs for the stratified estimator's standard error, over the
 * stratified samples actually used. Crude direct-strike variance is the exact Bernoulli one.
 */
function varianceReductionBench(sites: SiteInput[], a: AssumptionSet): void {
  let crudeSparkSamples = 0, stratSamples = 0, crudeDirectSamples = 0
  const ratios: number[] = []
  for (const site of sites) {
    const ps = prepareSite(site, a)
    const area = Math.PI * siteRadius(ps) ** 2
    const scale = ps.flashDensity * 1e-6 * area
    for (let t = 0; t < ps.nTanks; t++) {
      const strat = estimateTank(ps, t, createStream('bench', site.id, `vr-strat/${t}`), { targetRse: 1e-9, maxSamplesPerTank: 20_000 })
      const crudeN = 100_000
      const crude = crudeTankEstimate(ps, t, crudeN, createStream('bench', site.id, `vr-crude/${t}`))
      if (strat.sparking.rate > 0 && strat.sparking.se > 0 && crude.sparking.se > 0) {
        // Samples each method needs for the stratified run's standard error.
        const needCrude = crudeN * (crude.sparking.se / strat.sparking.se) ** 2
        crudeSparkSamples += needCrude
        stratSamples += strat.samples
        ratios.push(needCrude / strat.samples)
        const p = strat.direct.rate / scale
        if (strat.direct.se > 0) crudeDirectSamples += scale * scale * p * (1 - p) / strat.direct.se ** 2
      }
    }
  }
  ratios.sort((x, y) => x - y)
  line('variance reduction: tanks compared', `${ratios.length} (sparking figure)`)
  line('  stratified samples for its SE', `${(stratSamples / 1e6).toFixed(2)} M`)
  line('  crude samples for the same SE', `${(crudeSparkSamples / 1e6).toFixed(1)} M (sparking), ${(crudeDirectSamples / 1e6).toFixed(0)} M (direct strikes, to match the quadrature's error bound: they are not sampled)`)
  line('  ratio crude / stratified', `portfolio ${fmt(crudeSparkSamples / stratSamples)}×, per tank min ${fmt(ratios[0] ?? 0)}×, median ${fmt(ratios[Math.floor(ratios.length / 2)] ?? 0)}× (target ≥ 20×)`)
}

function frequencyBench(sites: SiteInput[], a: AssumptionSet): void {
  const run = timed(() => sites.map((s) => simulateSiteFrequency(s, a, { runSeed: 1, targetRse: TARGET_RSE })))
  const tanks = run.value.flatMap((r) => r.tanks)
  const samples = tanks.reduce((n, t) => n + t.samples, 0)
  const notConverged = tanks.filter((t) => !t.converged).length
  const worst = Math.max(...tanks.flatMap((t) => [t.direct, t.sparking]).filter((e) => e.rate >= 1e-5 && e.rate - 2 * e.se > 0).map((e) => e.se / e.rate))
  line(`frequency mode: ${tanks.length} tanks, ${sites.length} sites`, `${fmt(run.cpu)} s CPU (${fmt(run.wall)} s wall), target ≤ 12 s CPU (issue 17)`)
  line('  samples', `${(samples / 1e6).toFixed(1)} M, ${fmt(samples / tanks.length, 0)} per tank, max ${Math.max(...tanks.map((t) => t.samples))}`)
  line('  tanks at the target (or negligible)', `${tanks.length - notConverged} of ${tanks.length}; worst RSE of a figure ≥ 1e-5 /yr: ${(worst * 100).toFixed(2)} %`)
}

function yearBench(sites: SiteInput[], a: AssumptionSet): number {
  const run = timed(() => sites.map((s) => simulateSiteYears(s, a, { runSeed: 1, years: YEARS })))
  const roll = timed(() => rollUpYears(run.value))
  const candidates = run.value.reduce((n, r) => n + r.candidates, 0)
  const events = run.value.reduce((n, r) => n + r.events.year.length, 0)
  line(`year mode: ${YEARS} years × ${sites.length} sites`, `${fmt(run.cpu)} s CPU (${fmt(run.wall)} s wall), target ≤ 60 s`)
  line('  candidate flashes / loss events', `${(candidates / 1e6).toFixed(1)} M / ${(events / 1e6).toFixed(2)} M`)
  line('  portfolio roll-up', `${fmt(roll.cpu, 2)} s; AAL ${roll.value.summary.averageAnnualLoss.toFixed(0)}, 1-in-100 aggregate ${(roll.value.summary.aggregate.find((r) => r.returnPeriodYears === 100)?.loss ?? 0).toFixed(0)}`)
  return run.cpu
}

/**
 * Storm clustering (issue 21): the same years with flashes in storms. The generated sites get places
 * of their own (invented): 25 fields of 40 sites, each field 30 km across, fields over 600 km × 600 km.
 * Target: at most twice the independent simulated-years run.
 */
function clusteredYearBench(sites: SiteInput[], a: AssumptionSet, independentCpu: number): void {
  const rand = createStream('bench', 'clusters', 'places')
  const places = sites.map((s, k) => {
    const field = Math.floor(k / 40)
    const fieldLat = 28 + 5.4 * ((field % 5) + 0.5) / 5, fieldLon = -104 + 6.2 * (Math.floor(field / 5) + 0.5) / 5
    return { latitudeDeg: fieldLat + (rand() - 0.5) * 0.27, longitudeDeg: fieldLon + (rand() - 0.5) * 0.31, flashDensity: s.flashDensity }
  })
  const frame = clusteringFrame(places)
  const run = timed(() => sites.map((s, k) => simulateSiteYears(s, a, { runSeed: 1, years: YEARS, clustering: siteClustering(frame, a.stormClustering, places[k]!.latitudeDeg, places[k]!.longitudeDeg) })))
  const roll = rollUpYears(run.value)
  const candidates = run.value.reduce((n, r) => n + r.candidates, 0)
  line(`year mode with storm clustering (σ ${a.stormClustering.spreadKm} km, ${a.stormClustering.flashesPerStorm} flashes/storm)`, `${fmt(run.cpu)} s CPU (${fmt(run.wall)} s wall), ${fmt(run.cpu / independentCpu, 2)}× the independent run (target ≤ 2×)`)
  line('  candidate flashes; λmax', `${(candidates / 1e6).toFixed(1)} M; ${frame.maxFlashDensity.toFixed(2)} flashes/km²/yr`)
  line('  portfolio with clustering', `AAL ${roll.summary.averageAnnualLoss.toFixed(0)}, 1-in-100 aggregate ${(roll.summary.aggregate.find((r) => r.returnPeriodYears === 100)?.loss ?? 0).toFixed(0)}, 1-in-250 ${(roll.summary.aggregate.find((r) => r.returnPeriodYears === 250)?.loss ?? 0).toFixed(0)}`)
}

function quadratureBench(sites: SiteInput[], a: AssumptionSet): void {
  const tanks = sites.slice(0, 20).flatMap((s) => s.tanks.map((t) => ({ t, ng: s.flashDensity })))
  tanks.slice(0, 5).forEach(({ t, ng }) => isolatedTankQuadrature(t, ng, a)) // warm-up
  const run = timed(() => tanks.map(({ t, ng }) => isolatedTankQuadrature(t, ng, a)))
  line('quadrature (what-if panel)', `${fmt(run.wall / tanks.length * 1000, 2)} ms per tank (target well under 100 ms)`)
}

function main(): void {
  const a = parseAssumptions({})
  const sites = generatePortfolio(SITES, TANKS)
  console.log(`Stormledger engine benchmark — ${sites.length} generated sites, ${sites.reduce((n, s) => n + s.tanks.length, 0)} tanks, default assumptions, Node ${process.version}`)
  // `--years-only`: the simulated-years figures alone (independent and with storm clustering).
  if (!process.argv.includes('--years-only')) {
    kernelBench(sites.map((s) => prepareSite(s, a)))
    quadratureBench(sites, a)
    varianceReductionBench(sites.slice(0, 40), a)
    frequencyBench(sites, a)
  }
  const independentCpu = yearBench(sites, a)
  clusteredYearBench(sites, a, independentCpu)
}

main()
