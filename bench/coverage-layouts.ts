// Shadowed layouts and reference values for the interval-coverage check of frequency mode
// (bench/coverage.ts prints it; tests/unit/engine/coverage.test.ts runs a smaller version).
// The layouts are invented test inputs. The references do not use the adaptive estimator:
// - direct strikes: the deterministic quadrature at a tolerance 100× tighter than the error a run reports, and
//   independently a brute-force Monte Carlo that resolves every flash's attachment (attachFlash);
// - induced sparking: a stratified Monte Carlo with a fixed allocation (equal draws in every cell of
//   its own current × log-distance grid), unbiased with a textbook variance, sized so that its
//   standard error is at most a tenth of the estimator's.
import type { Estimate, SiteInput, TankInput } from '../shared/engine/types'
import type { AssumptionSet } from '../shared/engine/assumptions'
import type { PreparedSite } from '../shared/engine/kernel'
import { attachFlash, prepareSite, strikeRadius, tankSparkGivenAttachment } from '../shared/engine/kernel'
import { directStrikeQuadrature, isolatedDirectRadius } from '../shared/engine/direct-quadrature'
import { tankRelevantRadius } from '../shared/engine/reach'
import { createStream } from '../shared/engine/random'
import { simulateSiteFrequency } from '../shared/engine/frequency'

function tank(id: string, xM: number, yM: number, heightM: number, diameterM: number, over: Partial<TankInput> = {}): TankInput {
  return {
    id, tag: id.toUpperCase(), xM, yM, heightM, diameterM,
    material: 'frp', contents: 'condensate', flammableVapourSpace: true, chemicalFlashPointC: null,
    components: [{ componentClass: 'sharp_device', count: 1, heightM: 0.8 * heightM }],
    shieldRatingKa: null, vapourControl: false,
    replacementValue: 100_000, contentsValue: 50_000, cleanupCost: 30_000, interruptionCost: 20_000,
    ...over,
  }
}

/** Three shadowed layouts: a tank beside a taller mast, a short tank among taller tanks, tanks beside a stack. */
export const SHADOWED_LAYOUTS: readonly SiteInput[] = [
  {
    id: 'beside-mast', name: 'Tank beside a taller mast', flashDensity: 4,
    tanks: [tank('m1', 0, 0, 6, 3)],
    structures: [{ id: 'mast', kind: 'mast', xM: 12, yM: 0, heightM: 20, radiusM: 0.3 }],
  },
  {
    id: 'among-taller', name: 'Short tank among taller tanks', flashDensity: 4,
    tanks: [
      tank('c', 0, 0, 4, 3),
      tank('n', 0, 9, 10, 4, { components: [{ componentClass: 'grounded_pipe', count: 2, heightM: 8 }] }),
      tank('s', 0, -9, 10, 4, { contents: 'crude' }),
      tank('e', 9, 0, 10, 4, { components: [{ componentClass: 'rounded_conductor', count: 1, heightM: 9 }] }),
      tank('w', -9, 0, 10, 4),
    ],
    structures: [],
  },
  {
    id: 'beside-stack', name: 'Tanks beside a stack', flashDensity: 4,
    tanks: [tank('k1', 0, 0, 7, 3.5), tank('k2', 10, 0, 8, 4, { contents: 'crude' })],
    structures: [{ id: 'stack', kind: 'stack', xM: 5, yM: 12, heightM: 35, radiusM: 1.5 }],
  },
]

export type FigureName = 'direct' | 'sparking' | 'ignition'
export const FIGURES: readonly FigureName[] = ['direct', 'sparking', 'ignition']

export interface Reference { value: number; se: number }
export interface TankReference { tankId: string; direct: Reference; directBruteForce: Reference; sparking: Reference; ignition: Reference }

const CURRENT_EDGES = [0, 0.002, 0.005, 0.01, 0.02, 0.04, 0.07, 0.1, 0.15, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.87, 0.92, 0.95, 0.97, 0.98, 0.99, 0.995, 0.998, 0.999, 1]
const DISTANCE_CELLS = 20
const NEAR_M = 1

/**
 * Fixed-allocation stratified Monte Carlo for one tank: `perCell` draws in each cell of current
 * probability × distance (first cell 0–1 m, then log-spaced to the tank's relevant radius at that
 * current). Direct strikes and sparking from one flash each, attachment resolved by attachFlash.
 */
export function bruteForceTank(ps: PreparedSite, t: number, perCell: number, seed: string): { direct: Reference; sparking: Reference } {
  const rand = createStream(seed, ps.siteId, `reference/${t}`)
  const scale = ps.flashDensity * 1e-6
  let direct = 0, directVar = 0, sparking = 0, sparkingVar = 0
  for (let k = 0; k + 1 < CURRENT_EDGES.length; k++) {
    const uLo = CURRENT_EDGES[k]!
    const w = CURRENT_EDGES[k + 1]! - uLo
    for (let m = 0; m < DISTANCE_CELLS; m++) {
      let sd = 0, sd2 = 0, ss = 0, ss2 = 0
      for (let i = 0; i < perCell; i++) {
        const lnI = ps.law.logQuantile(uLo + w * rand())
        const current = Math.exp(lnI)
        const rs = strikeRadius(ps, lnI)
        const outer = Math.max(tankRelevantRadius(ps, t, current, rs), isolatedDirectRadius(ps, t, rs), 2 * NEAR_M)
        const r0 = m === 0 ? 0 : NEAR_M * Math.pow(outer / NEAR_M, (m - 1) / (DISTANCE_CELLS - 1))
        const r1 = NEAR_M * Math.pow(outer / NEAR_M, m / (DISTANCE_CELLS - 1))
        const area = Math.PI * (r1 * r1 - r0 * r0)
        const r = Math.sqrt(r0 * r0 + (r1 * r1 - r0 * r0) * rand())
        const theta = 2 * Math.PI * rand()
        const px = ps.objX[t]! + r * Math.cos(theta)
        const py = ps.objY[t]! + r * Math.sin(theta)
        const attached = attachFlash(ps, px, py, rs)
        if (attached === t) { sd += area; sd2 += area * area; continue }
        const h = area * tankSparkGivenAttachment(ps, t, current, lnI, attached, px, py)
        ss += h; ss2 += h * h
      }
      const n = perCell
      const md = sd / n, ms = ss / n
      direct += w * md
      sparking += w * ms
      directVar += w * w * Math.max(0, (sd2 - n * md * md) / (n - 1)) / n
      sparkingVar += w * w * Math.max(0, (ss2 - n * ms * ms) / (n - 1)) / n
    }
  }
  return {
    direct: { value: scale * direct, se: scale * Math.sqrt(directVar) },
    sparking: { value: scale * sparking, se: scale * Math.sqrt(sparkingVar) },
  }
}

/** Reference values for every tank of a layout. */
export function layoutReferences(site: SiteInput, a: AssumptionSet, perCell: number): TankReference[] {
  const ps = prepareSite(site, a)
  return site.tanks.map((tk, t) => {
    const q = directStrikeQuadrature(ps, t, CURRENT_EDGES, { relativeTolerance: 1e-5, absoluteTolerancePerYear: 1e-14, maxPanels: 2000 })
    const bf = bruteForceTank(ps, t, perCell, 'coverage-reference')
    const pid = ps.pIgnDirect[t]!
    const pis = ps.pIgnSpark[t]!
    return {
      tankId: tk.id,
      direct: { value: q.ratePerYear, se: q.errorPerYear },
      directBruteForce: bf.direct,
      sparking: bf.sparking,
      ignition: { value: pid * q.ratePerYear + pis * bf.sparking.value, se: Math.hypot(pid * q.errorPerYear, pis * bf.sparking.se) },
    }
  })
}

export interface FigureCoverage {
  layout: string
  tankId: string
  figure: FigureName
  reference: Reference
  seeds: number
  /** Share of seeds whose 95 % interval holds the reference. */
  coverage: number
  meanEstimate: number
  meanSe: number
  /** Standard deviation of the estimate across seeds over the mean reported standard error (0 when both are 0). */
  spreadOverSe: number
  /** √ mean((estimate − reference)² / SE²) over seeds: ≈ 1 for honest standard errors. */
  rmsZ: number
  /** Largest reference standard error over the mean reported one (must stay ≤ 0.1 for the reference to count). */
  referenceSeRatio: number
}

/** Runs frequency mode with seeds 1…seeds and compares every tank's figures ≥ `minRate` with the references. */
export function coverageOfLayout(site: SiteInput, a: AssumptionSet, refs: TankReference[], seeds: number, targetRse: number, minRate = 1e-6): FigureCoverage[] {
  const runs = Array.from({ length: seeds }, (_, i) => simulateSiteFrequency(site, a, { runSeed: i + 1, targetRse }).tanks)
  const out: FigureCoverage[] = []
  site.tanks.forEach((tk, t) => {
    for (const figure of FIGURES) {
      const reference = refs[t]![figure]
      if (reference.value < minRate) continue
      const ests: Estimate[] = runs.map((r) => r[t]![figure])
      const mean = ests.reduce((s, e) => s + e.rate, 0) / seeds
      const meanSe = ests.reduce((s, e) => s + e.se, 0) / seeds
      const sd = Math.sqrt(ests.reduce((s, e) => s + (e.rate - mean) ** 2, 0) / (seeds - 1))
      const z2 = ests.reduce((s, e) => s + (e.se > 0 ? ((e.rate - reference.value) / e.se) ** 2 : e.rate === reference.value ? 0 : Infinity), 0)
      out.push({
        layout: site.id, tankId: tk.id, figure, reference, seeds,
        coverage: ests.filter((e) => e.lo <= reference.value && reference.value <= e.hi).length / seeds,
        meanEstimate: mean, meanSe,
        spreadOverSe: meanSe > 0 ? sd / meanSe : sd === 0 ? 0 : Infinity,
        rmsZ: Math.sqrt(z2 / seeds),
        referenceSeRatio: meanSe > 0 ? reference.se / meanSe : 0,
      })
    }
  })
  return out
}
