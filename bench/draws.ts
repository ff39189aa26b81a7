// Assumption-draws benchmark (issue "How sure are we"). Prints the cost of K draws over the
// 5,000-tank engine benchmark portfolio (bench/engine-portfolio.ts) against K single runs.
//   npx tsx bench/draws.ts [--sites N] [--draws K] [--defaults]     (wire as `npm run bench:draws`)
// --defaults draws the 26 illustrative default ranges (uncertainty-defaults.ts), which the plan
// takes in natural groups (Sobol' group indices); without it, the 11 benchmark ranges below.
// A "single run" is the central frequency-mode figure of every site (simulateSiteFrequency at
// 2 % RSE, what a run without draws computes); "draws" is what a run with draws adds: the shared
// flashes, every evaluation of the design (central, A, B, A_B^g) and the bands and indices.
// Times are CPU seconds of this single-threaded process, wall beside them.
import { parseAssumptions } from '../shared/engine/assumptions'
import { simulateSiteFrequency } from '../shared/engine/frequency'
import { planAssumptionDraws, evaluationCount } from '../shared/engine/draws'
import { DRAW_FLASHES_PER_SITE, siteDrawValues, summariseSiteDraws } from '../shared/engine/draw-figures'
import { simulateSiteYears } from '../shared/engine/years'
import { DRAW_YEARS, siteYearDrawValues } from '../shared/engine/year-draws'
import { illustrativeUncertainty } from '../shared/engine/uncertainty-defaults'
import { generatePortfolio } from './engine-portfolio'
import { timed } from './cpu-time'

const arg = (name: string, fallback: number) => {
  const i = process.argv.indexOf(name)
  return i > 0 ? Number(process.argv[i + 1]) : fallback
}
const SITES = arg('--sites', 1000)
const K = arg('--draws', 100)

const line = (label: string, text: string) => console.log(`${label.padEnd(52)} ${text}`)

// Illustrative uncertainty of the kind the assumptions page offers: sparking levels and scatter,
// flash density, the current law, ignition, damage and spread (invented ranges for the benchmark).
const L = (path: string, median: number, sigmaLn: number) => ({ path, distribution: { kind: 'lognormal' as const, median, sigmaLn }, basis: 'illustrative' as const, note: 'benchmark' })
const U = (path: string, min: number, max: number) => ({ path, distribution: { kind: 'uniform' as const, min, max }, basis: 'illustrative' as const, note: 'benchmark' })
const benchmarkRanges = parseAssumptions({ uncertainty: {
  entries: [
    L('flashDensityFactor', 1, 0.25),
    L('thresholds.sharp_device.u50Kv', 70, 0.25), U('thresholds.sharp_device.sigma', 0.2, 0.4),
    L('thresholds.grounded_pipe.u50Kv', 100, 0.25), L('thresholds.rounded_conductor.u50Kv', 140, 0.25), L('thresholds.carbon_fibre.u50Kv', 90, 0.25),
    L('powerLawMedianKa', 31, 0.08),
    U('ignitionGivenSpark.crude', 0.15, 0.45), U('ignitionGivenSpark.condensate', 0.2, 0.6),
    U('damageRatio.replacement.mean', 0.5, 0.85), U('fireSpread.probabilityAtContact', 0.1, 0.4),
  ],
  correlations: [{ a: 'thresholds.sharp_device.u50Kv', b: 'thresholds.sharp_device.sigma', rho: -0.3 }],
} })
const assumptions = process.argv.includes('--defaults') ? parseAssumptions({ uncertainty: illustrativeUncertainty() }) : benchmarkRanges

const all = generatePortfolio(1000, 5000)
const sites = all.slice(0, SITES)
const tanks = sites.reduce((n, s) => n + s.tanks.length, 0)
console.log(`assumption draws: ${assumptions.uncertainty.entries.length} uncertain assumptions, ${sites.length} sites / ${tanks} tanks of the 5,000-tank benchmark portfolio, K = ${K}`)
const plan = timed(() => planAssumptionDraws(assumptions, { draws: K, runSeed: 1 }))
line('draw plan (matrices A, B, A_B^g; validated sets)', `${plan.cpu.toFixed(2)} s CPU, ${plan.value.factors.length} factors (${plan.value.factors.filter((f) => f.members).length} groups), ${evaluationCount(plan.value)} evaluations, ${plan.value.clamped} sd clamped`)

const central = timed(() => sites.map((s) => simulateSiteFrequency(s, assumptions, { runSeed: 1 })))
line('single run (central figures, 2 % RSE)', `${central.cpu.toFixed(1)} s CPU (${central.wall.toFixed(1)} s wall)`)

// Bands only: the plan's A rows; then the full design with the sensitivity indices.
const bandsOnly = { ...plan.value, b: [], ab: [], factors: [] }
const bands = timed(() => sites.map((s) => siteDrawValues(s, bandsOnly, { runSeed: 1 })))
line(`bands only (${K} draws + central, ${DRAW_FLASHES_PER_SITE} shared flashes per site)`, `${bands.cpu.toFixed(1)} s CPU (${bands.wall.toFixed(1)} s wall)`)
const full = timed(() => sites.map((s, i) => {
  const v = siteDrawValues(s, plan.value, { runSeed: 1 })
  const c = central.value[i]!.tanks.map((t) => ({ direct: t.direct.rate, sparking: t.sparking.rate, ignition: t.ignition.rate, expectedAnnualLoss: t.expectedAnnualLoss.rate }))
  return summariseSiteDraws(v, c, plan.value, `1|${s.id}`)
}))
line('bands + sensitivity (the whole design, as a run does)', `${full.cpu.toFixed(1)} s CPU (${full.wall.toFixed(1)} s wall)`)
const kSingle = K * central.cpu
line('cost ÷ (K single runs), bands only', `${(bands.cpu / kSingle).toFixed(3)} (target ≤ 0.2)`)
line('cost ÷ (K single runs), bands + sensitivity', `${(full.cpu / kSingle).toFixed(3)} (target ≤ 0.2)`)
const flashes = bands.value.reduce((n, v) => n + v.flashes, 0)
line('shared flashes kept', `${flashes} (${(flashes / sites.length).toFixed(0)} per site of ${DRAW_FLASHES_PER_SITE})`)

// Simulated years (year-draws.ts): a single run is the central years of every site; the draws add
// K re-simulations over min(years, DRAW_YEARS) years each, plus the central re-simulation.
const YEAR_SITES = arg('--year-sites', 50)
const YEARS = arg('--years', 10_000)
const ySites = sites.slice(0, YEAR_SITES)
const yearPlan = { ...plan.value, b: [], ab: [], factors: [] }
console.log(`simulated years: ${ySites.length} sites, ${YEARS} years, K = ${K}, ${Math.min(YEARS, DRAW_YEARS)} years per draw`)
const ySingle = timed(() => ySites.map((s) => simulateSiteYears(s, assumptions, { runSeed: 1, years: YEARS })))
line(`single run (${YEARS} simulated years)`, `${ySingle.cpu.toFixed(1)} s CPU (${ySingle.wall.toFixed(1)} s wall)`)
const yDraws = timed(() => ySites.map((s) => siteYearDrawValues(s, yearPlan, { runSeed: 1, years: YEARS })))
line(`years draws (${K} draws + central, re-simulated)`, `${yDraws.cpu.toFixed(1)} s CPU (${yDraws.wall.toFixed(1)} s wall)`)
line('cost ÷ (K single runs), years bands', `${(yDraws.cpu / (K * ySingle.cpu)).toFixed(3)} (= (1 + 1/K) × years per draw ÷ run years, about)`)
