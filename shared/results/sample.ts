// SAMPLE figures for the chart gallery (/preview/results) only: invented, generated from a fixed
// seed so every render and every screenshot is the same. Nothing here is a result of the engine.
import seedrandom from 'seedrandom'
import type { DriverInput, EventBands, ExceedancePoint, ExceedanceSeries, HeadlineFigures, MapSite, MetricDef, SiteMetricRow, TankSparkingGrid } from './types'
import { binEvents } from './bands'

const RETURN_PERIODS = [1, 2, 5, 10, 20, 25, 50, 100, 200, 250, 500, 1000, 2000, 5000]

/** Invented site names: no real place, company or brand. */
const SITE_NAMES = ['Harrow Flat', 'Copper Wash', 'Lindqvist Draw', 'Marl Ridge', 'Ossory Bend', 'Pellow Tank Farm', 'Quillan Mesa', 'Sorrel Creek', 'Tamsin Basin', 'Vetch Hollow']

export const SAMPLE_CURRENCY = 'USD'

export const sampleMetrics: MetricDef[] = [
  { key: 'ignition', label: 'Fires', format: 'frequency', logScale: true },
  { key: 'sparking', label: 'Induced sparking', format: 'frequency', logScale: true },
  { key: 'direct', label: 'Direct strikes', format: 'frequency', logScale: true },
  { key: 'aal', label: 'Average annual loss', format: 'money', logScale: true },
  { key: 'loss250', label: 'Loss at 250 years', format: 'money', logScale: true },
  { key: 'tanks', label: 'Tanks', format: 'number', unit: 'tanks' },
]

function normal(rand: () => number): number {
  // Box–Muller (common practice).
  const u = Math.max(1e-12, rand())
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * rand())
}

function poisson(mean: number, rand: () => number): number {
  // Knuth's multiplication method: fine for the small means used here.
  const limit = Math.exp(-mean)
  let k = 0
  let p = rand()
  while (p > limit) { k++; p *= rand() }
  return k
}

/** Loss at each return period from simulated year values (the value ranked Y/T from the top). */
function curveFromYears(yearValues: number[]): ExceedancePoint[] {
  const sorted = [...yearValues].sort((a, b) => b - a)
  return RETURN_PERIODS.filter((t) => t <= sorted.length).map((t) => ({ returnPeriodYears: t, loss: sorted[Math.max(0, Math.floor(sorted.length / t) - 1)]! }))
}

interface SampleSite { id: string; name: string; latitude: number; longitude: number; tanks: number; insuredValue: number; fireRate: number; sparkRate: number; directRate: number; meanLoss: number }

export interface SampleResults {
  currency: string
  headline: HeadlineFigures
  exceedance: ExceedanceSeries[]
  siteComparison: ExceedanceSeries[]
  drivers: DriverInput[]
  rows: SiteMetricRow[]
  mapSites: MapSite[]
  tankGrid: TankSparkingGrid
  tankName: string
  eventBands: EventBands
}

export function sampleResults(seed = 'stormledger-gallery'): SampleResults {
  const rand = seedrandom(seed)
  const sites: SampleSite[] = SITE_NAMES.map((name, k) => {
    const tanks = 2 + Math.floor(rand() * 10)
    const sparkRate = tanks * 10 ** (-3.3 + rand() * 1.3)
    const directRate = tanks * 10 ** (-3.6 + rand() * 0.8)
    return {
      id: `sample-site-${k + 1}`, name, tanks,
      latitude: 29 + rand() * 6.5, longitude: -103 + rand() * 8.5,
      insuredValue: tanks * (180_000 + rand() * 420_000),
      sparkRate, directRate, fireRate: 0.3 * sparkRate + 0.5 * directRate,
      meanLoss: 250_000 + rand() * 900_000,
    }
  })
  const years = 20_000
  const portfolioAgg: number[] = []
  const portfolioOcc: number[] = []
  const bySiteAgg = new Map<string, number[]>(sites.map((s) => [s.id, []]))
  for (let y = 0; y < years; y++) {
    let total = 0
    let largest = 0
    for (const s of sites) {
      const n = poisson(s.fireRate, rand)
      let siteTotal = 0
      for (let e = 0; e < n; e++) {
        const loss = s.meanLoss * Math.exp(0.6 * normal(rand) - 0.18)
        siteTotal += loss
        largest = Math.max(largest, loss)
      }
      bySiteAgg.get(s.id)!.push(siteTotal)
      total += siteTotal
    }
    portfolioAgg.push(total)
    portfolioOcc.push(largest)
  }
  const sum = (xs: number[]) => xs.reduce((a, b) => a + b, 0)
  const fires = sum(sites.map((s) => s.fireRate))
  const sparks = sum(sites.map((s) => s.sparkRate))
  const directs = sum(sites.map((s) => s.directRate))
  const aal = sum(portfolioAgg) / years
  const agg = curveFromYears(portfolioAgg)
  const at = (t: number) => agg.find((p) => p.returnPeriodYears === t)?.loss ?? 0
  const sortedAgg = [...portfolioAgg].sort((a, b) => b - a)
  const tail = sortedAgg.slice(0, years / 250)
  const headline: HeadlineFigures = {
    ignitionPerYear: { value: fires, lo: fires * 0.9, hi: fires * 1.1 },
    sparkingPerYear: { value: sparks, lo: sparks * 0.93, hi: sparks * 1.07 },
    // A narrow interval whose ends share their first two figures: the printer must not show it as "x–x".
    directPerYear: { value: directs, lo: directs * 0.996, hi: directs * 1.004 },
    averageAnnualLoss: { value: aal, lo: aal * 0.88, hi: aal * 1.12 },
    lossAt100Years: { value: at(100), lo: at(100) * 0.85, hi: at(100) * 1.15 },
    lossAt250Years: { value: at(250), lo: at(250) * 0.8, hi: at(250) * 1.2 },
    tailValueAtRisk: { value: sum(tail) / tail.length, lo: null, hi: null },
    tailReturnPeriodYears: 250,
  }
  const top3 = [...sites].sort((a, b) => b.fireRate - a.fireRate).slice(0, 3)
  const rows: SiteMetricRow[] = sites.map((s) => {
    const siteAgg = [...bySiteAgg.get(s.id)!].sort((a, b) => b - a)
    return {
      siteId: s.id, siteName: s.name,
      values: { ignition: s.fireRate, sparking: s.sparkRate, direct: s.directRate, aal: sum(siteAgg) / years, loss250: siteAgg[years / 250 - 1] ?? 0, tanks: s.tanks },
    }
  })
  const drivers: DriverInput[] = sites.flatMap((s) => Array.from({ length: Math.min(3, s.tanks) }, (_, k) => ({
    id: `${s.id}-tank-${k + 1}`, label: `${s.name.split(' ')[0]!.slice(0, 3).toUpperCase()}-T${k + 1}`, kind: 'tank' as const,
    value: (s.fireRate * s.meanLoss / s.tanks) * (1.6 - 0.4 * k) * (0.6 + rand() * 0.8),
    detail: `${s.name} · FRP · crude`, to: `/sites/${s.id}`,
  })))
  return {
    currency: SAMPLE_CURRENCY,
    headline,
    exceedance: [
      { name: 'Portfolio, aggregate', kind: 'aggregate', points: agg },
      { name: 'Portfolio, occurrence', kind: 'occurrence', points: curveFromYears(portfolioOcc) },
    ],
    siteComparison: top3.map((s) => ({ name: s.name, kind: 'aggregate', points: curveFromYears(bySiteAgg.get(s.id)!) })),
    drivers,
    rows,
    mapSites: sites.map((s, k) => ({ id: s.id, name: s.name, latitude: s.latitude, longitude: s.longitude, insuredValue: s.insuredValue, values: rows[k]!.values })),
    tankGrid: sampleTankGrid(),
    tankName: 'HAR-T1 (sample: 7 m FRP tank, float gauge)',
    eventBands: sampleEventBands(rand),
  }
}

// --- the sample tank: the formulas of MODEL.md §2–§4 in their plainest form ---------------------
const SAMPLE_TANK = { heightM: 7, radiusM: 2, u50Kv: 70, sigma: 0.3, coupling: 38.8 }

function standardNormalCdf(z: number): number {
  // Abramowitz & Stegun 7.1.26 for erf (|error| < 1.5e-7); enough for a sample picture.
  const x = Math.abs(z) / Math.SQRT2
  const t = 1 / (1 + 0.3275911 * x)
  const erf = 1 - (((((1.061405429 * t - 1.453152027) * t) + 1.421413741) * t - 0.284496736) * t + 0.254829592) * t * Math.exp(-x * x)
  return z >= 0 ? 0.5 * (1 + erf) : 0.5 * (1 - erf)
}

function sampleSparkProbability(currentKa: number, distanceM: number): number {
  const { heightM, radiusM, u50Kv, sigma, coupling } = SAMPLE_TANK
  const potential = coupling * currentKa * heightM / Math.max(distanceM, heightM, radiusM)
  return standardNormalCdf(Math.log(potential / u50Kv) / sigma)
}

function sampleDirectDistance(currentKa: number): number {
  const { heightM, radiusM } = SAMPLE_TANK
  const rs = 10 * currentKa ** 0.65
  return heightM >= rs ? radiusM + rs : radiusM + Math.sqrt(rs * rs - (rs - heightM) ** 2)
}

const logSpace = (from: number, to: number, n: number) => Array.from({ length: n }, (_, k) => Number((from * (to / from) ** (k / (n - 1))).toPrecision(3)))

function sampleTankGrid(): TankSparkingGrid {
  const currentsKa = logSpace(3, 200, 20)
  const distancesM = logSpace(5, 3000, 26)
  return {
    currentsKa, distancesM,
    probability: currentsKa.map((i) => distancesM.map((y) => sampleSparkProbability(i, y))),
    directStrikeDistanceM: currentsKa.map(sampleDirectDistance),
  }
}

function sampleEventBands(rand: () => number): EventBands {
  const currentEdgesKa = [2, 10, 20, 40, 80, 160, Infinity]
  const distanceEdgesM = [0, 50, 100, 200, 400, 800, 1600]
  const events: { currentKa: number, distanceM: number, weight: number }[] = []
  for (let k = 0; k < 30_000; k++) {
    const u = Math.max(1e-9, rand())
    const currentKa = Math.max(2, 31 * ((1 - u) / u) ** (1 / 2.6))
    const distanceM = 1600 * Math.sqrt(rand())
    const direct = distanceM < sampleDirectDistance(currentKa)
    events.push({ currentKa, distanceM, weight: direct ? 1 : sampleSparkProbability(currentKa, distanceM) })
  }
  return { currentEdgesKa, distanceEdgesM, values: binEvents(events, currentEdgesKa, distanceEdgesM) }
}
