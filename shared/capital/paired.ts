// Scenario evaluation on common random numbers. For each tank of a site, one fixed stratified
// sample of flashes (current × distance from the tank, drawn from the tank's own stream) is
// evaluated against the baseline site and against every scenario of that site, so each scenario's
// reduction is the mean of paired differences: its standard error holds only the spread of the
// differences, not the spread of two separate estimates. The design (strata, sample counts, reach)
// depends on no scenario's outcome, so every draw pairs up. Same physics as the runs: every
// probability comes from the engine's kernel.
import type { AssumptionSet } from '../engine/assumptions'
import type { SiteInput } from '../engine/types'
import type { PreparedSite } from '../engine/kernel'
import { attachFlash, captureReach, createArcScratch, directCaptureFraction, prepareSite, strikeRadius, tankSparkGivenAttachment } from '../engine/kernel'
import { tankRelevantRadius } from '../engine/reach'
import { createStream } from '../engine/random'
import { Z95 } from '../engine/statistics'

export const METRICS = ['direct', 'sparking', 'ignition', 'loss'] as const
export type Metric = typeof METRICS[number]
const NM = METRICS.length

/** A rate per year (or money per year for loss) with its standard error. */
export interface RateSe { rate: number, se: number }

export interface PairedFigure {
  baseline: RateSe
  scenario: RateSe
  /** baseline − scenario, from paired draws, with its 95 % interval. */
  reduction: { rate: number, se: number, lo: number, hi: number }
  /** Standard error the same reduction would have from two independent estimates of this size. */
  independentSe: number
}

export type MetricFigures = Record<Metric, PairedFigure>

export interface ScenarioInput { key: string, site: SiteInput }
export interface ScenarioOutcome { key: string, site: MetricFigures, tanks: Array<{ tankId: string, tag: string } & MetricFigures> }

export interface PairedOptions {
  seed: number | string
  /** Draws per tank, the same for baseline and scenarios (default 20 000). */
  samplesPerTank?: number
}

export interface PairedResult { siteId: string, samplesPerTank: number, scenarios: ScenarioOutcome[] }

// Current strata in probability space of the truncated law (finer at the top, where the largest
// currents reach furthest), and distance strata: the direct-strike disc, then log-spaced rings.
const CURRENT_BOUNDS = [0, 0.03, 0.15, 0.5, 0.8, 0.9375, 0.984375, 0.99609375, 0.9990234375, 1]
const RINGS = 10
const N_CURRENT = CURRENT_BOUNDS.length - 1
const N_RADIAL = 1 + RINGS
const N_STRATA = N_CURRENT * N_RADIAL

/** Which scenarios change tank t (a scenario that adds a structure changes every tank). */
function changedTanks(base: SiteInput, scenario: SiteInput): boolean[] {
  const structuresChanged = JSON.stringify(base.structures) !== JSON.stringify(scenario.structures)
  return base.tanks.map((tank, t) => {
    const other = scenario.tanks[t]
    if (!other || other.id !== tank.id) throw new Error(`scenario "${scenario.id}" does not keep the tanks of site "${base.id}" in order`)
    return structuresChanged || JSON.stringify(tank) !== JSON.stringify(other)
  })
}

/** Per-draw figures of tank t in a prepared site: direct, sparking, ignition, loss (already × area). */
function drawFigures(ps: PreparedSite, t: number, arcs: ReturnType<typeof createArcScratch>, area: number, current: number, lnI: number, rs: number, r: number, cos: number, sin: number, out: Float64Array, at: number): void {
  const px = ps.objX[t]! + r * cos
  const py = ps.objY[t]! + r * sin
  const direct = area * directCaptureFraction(ps, t, rs, r, arcs)
  const attached = attachFlash(ps, px, py, rs)
  const spark = area * tankSparkGivenAttachment(ps, t, current, lnI, attached, px, py)
  const ignition = ps.pIgnDirect[t]! * direct + ps.pIgnSpark[t]! * spark
  out[at] = direct
  out[at + 1] = spark
  out[at + 2] = ignition
  out[at + 3] = ignition * ps.severity[t]!
}

/** Baseline and scenario sites evaluated on the same draws. Deterministic in (sites, assumptions, seed). */
export function evaluateScenariosPaired(base: SiteInput, scenarios: readonly ScenarioInput[], assumptions: AssumptionSet, options: PairedOptions): PairedResult {
  const samplesPerTank = options.samplesPerTank ?? 20_000
  const perStratum = Math.max(2, Math.ceil(samplesPerTank / N_STRATA))
  const psBase = prepareSite(base, assumptions)
  const prepared = scenarios.map(s => prepareSite(s.site, assumptions))
  const changed = scenarios.map(s => changedTanks(base, s.site))
  const scale = psBase.flashDensity * 1e-6
  const S = scenarios.length
  // Per tank: [metric] sums for the baseline and, per scenario, sums of y and of d = x − y.
  const tankOutcomes = base.tanks.map((tank, t) => {
    const active = changed.map((c, k) => (c[t] ? k : -1)).filter(k => k >= 0)
    const stats = estimateTank(psBase, prepared, active, t, createStream(options.seed, base.id, `capital/${tank.id}`), perStratum, scale, S)
    return { tankId: tank.id, tag: tank.tag, stats }
  })
  return {
    siteId: base.id,
    samplesPerTank: perStratum * N_STRATA,
    scenarios: scenarios.map((s, k) => {
      const tanks = tankOutcomes.map(o => ({ tankId: o.tankId, tag: o.tag, ...o.stats[k]! }))
      return { key: s.key, site: sumFigures(tanks), tanks }
    }),
  }
}

interface Moments { sum: Float64Array, sum2: Float64Array }
const moments = (size: number): Moments => ({ sum: new Float64Array(size), sum2: new Float64Array(size) })

function estimateTank(psBase: PreparedSite, prepared: PreparedSite[], active: number[], t: number, rand: () => number, perStratum: number, scale: number, S: number): MetricFigures[] {
  const arcsBase = createArcScratch(psBase)
  const arcs = prepared.map(p => createArcScratch(p))
  // Slots per stratum: baseline x (NM), then per active scenario y (NM) and d (NM).
  const width = NM * (1 + 2 * active.length)
  const acc = moments(N_STRATA * width)
  const values = new Float64Array(NM * (1 + active.length))
  for (let k = 0; k < N_CURRENT; k++) {
    const uLo = CURRENT_BOUNDS[k]!
    const du = CURRENT_BOUNDS[k + 1]! - uLo
    for (let m = 0; m < N_RADIAL; m++) {
      const s = k * N_RADIAL + m
      for (let i = 0; i < perStratum; i++) {
        // Three draws every time, whatever happens below: the streams never drift apart.
        const lnI = psBase.law.logQuantile(uLo + du * rand())
        const uR = rand()
        const theta = 2 * Math.PI * rand()
        const current = Math.exp(lnI)
        const rs = strikeRadius(psBase, lnI)
        let outer = tankRelevantRadius(psBase, t, current, rs)
        for (const a of active) outer = Math.max(outer, tankRelevantRadius(prepared[a]!, t, current, rs))
        const inner = Math.min(outer, captureReach(psBase, t, rs))
        const [r0, r1] = ringEdges(m, inner, outer, psBase.objRadius[t]!)
        const ring = r1 * r1 - r0 * r0
        if (!(ring > 0)) continue
        const area = Math.PI * ring
        const r = Math.sqrt(r0 * r0 + ring * uR)
        const cos = Math.cos(theta)
        const sin = Math.sin(theta)
        drawFigures(psBase, t, arcsBase, area, current, lnI, rs, r, cos, sin, values, 0)
        for (let j = 0; j < active.length; j++) {
          const a = active[j]!
          drawFigures(prepared[a]!, t, arcs[a]!, area, current, lnI, rs, r, cos, sin, values, NM * (1 + j))
        }
        const base = s * width
        for (let q = 0; q < NM; q++) {
          const x = values[q]!
          acc.sum[base + q]! += x
          acc.sum2[base + q]! += x * x
          for (let j = 0; j < active.length; j++) {
            const y = values[NM * (1 + j) + q]!
            const iy = base + NM * (1 + 2 * j) + q
            const id = iy + NM
            const d = x - y
            acc.sum[iy]! += y
            acc.sum2[iy]! += y * y
            acc.sum[id]! += d
            acc.sum2[id]! += d * d
          }
        }
      }
    }
  }
  const stratified = (slot: number): RateSe => {
    let mean = 0
    let variance = 0
    for (let s = 0; s < N_STRATA; s++) {
      const w = CURRENT_BOUNDS[((s / N_RADIAL) | 0) + 1]! - CURRENT_BOUNDS[(s / N_RADIAL) | 0]!
      const n = perStratum
      const sum = acc.sum[s * width + slot]!
      const mu = sum / n
      const v = Math.max(0, (acc.sum2[s * width + slot]! - n * mu * mu) / (n - 1))
      mean += w * mu
      variance += w * w * v / n
    }
    return { rate: mean * scale, se: Math.sqrt(variance) * scale }
  }
  const baseline = METRICS.map((_, q) => stratified(q))
  const out: MetricFigures[] = []
  for (let k = 0; k < S; k++) {
    const j = active.indexOf(k)
    const figures = {} as MetricFigures
    METRICS.forEach((metric, q) => {
      const x = baseline[q]!
      if (j < 0) {
        figures[metric] = paired(x, x, { rate: 0, se: 0 })
        return
      }
      const y = stratified(NM * (1 + 2 * j) + q)
      const d = stratified(NM * (2 + 2 * j) + q)
      figures[metric] = paired(x, y, d)
    })
    out.push(figures)
  }
  return out
}

/** Edges of distance stratum m: the direct-strike disc, then rings log-spaced from its edge to the reach. */
function ringEdges(m: number, inner: number, outer: number, tankRadius: number): [number, number] {
  if (m === 0) return [0, inner]
  const start = Math.max(inner, tankRadius, 1)
  if (outer <= start) return m === 1 ? [inner, outer] : [outer, outer]
  const ratio = outer / start
  const e0 = m === 1 ? inner : start * ratio ** ((m - 1) / RINGS)
  const e1 = start * ratio ** (m / RINGS)
  return [e0, m === RINGS ? outer : e1]
}

function paired(x: RateSe, y: RateSe, d: RateSe): PairedFigure {
  return {
    baseline: x,
    scenario: y,
    reduction: { rate: d.rate, se: d.se, lo: d.rate - Z95 * d.se, hi: d.rate + Z95 * d.se },
    independentSe: Math.sqrt(x.se * x.se + y.se * y.se),
  }
}

/** Site figures: tanks use separate streams, so their estimates are independent and variances add. */
function sumFigures(tanks: readonly MetricFigures[]): MetricFigures {
  const out = {} as MetricFigures
  for (const metric of METRICS) {
    const add = (pick: (f: PairedFigure) => RateSe): RateSe => {
      let rate = 0
      let v = 0
      for (const t of tanks) { const e = pick(t[metric]); rate += e.rate; v += e.se * e.se }
      return { rate, se: Math.sqrt(v) }
    }
    const x = add(f => f.baseline)
    const y = add(f => f.scenario)
    const d = add(f => f.reduction)
    out[metric] = paired(x, y, d)
  }
  return out
}
