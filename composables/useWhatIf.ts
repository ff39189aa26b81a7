// The tank what-if's only contact with the risk engine: builds the engine's inputs from the panel's
// parameters and recomputes as they change — the deterministic single-tank quadrature and the
// current × distance grid at once (lightly debounced), a quick Monte Carlo check a moment later.
import { ENGINE_VERSION, isolatedTankQuadrature, parseAssumptions, simulateSiteFrequency, tankSparkingHeatmap } from '~~/shared/engine'
import type { SiteInput, TankInput } from '~~/shared/engine/types'
import type { TankSparkingGrid, RangedFigure } from '~~/shared/results/types'
import { toSparkingGrid } from '~~/shared/results/engine-grid'
import type { WhatIfParams } from '~~/shared/results/whatif-params'

export interface WhatIfResult { sparkingPerYear: number, directPerYear: number, ignitionPerYear: number }
export interface WhatIfCheck { sparking: RangedFigure, direct: RangedFigure, ignition: RangedFigure, samples: number }

/** Stroke currents (kA) and distances (m) of the heatmap, log-spaced. */
const logSpace = (from: number, to: number, n: number) => Array.from({ length: n }, (_, k) => Number((from * (to / from) ** (k / (n - 1))).toPrecision(3)))
export const WHATIF_GRID = { currentsKa: logSpace(3, 200, 18), distancesM: logSpace(3, 3000, 24) }

/** Money figures of the what-if tank (the panel shows frequencies only; severity does not affect them). */
const NOMINAL_VALUES = { replacementValue: 250_000, contentsValue: 150_000, cleanupCost: 100_000, interruptionCost: 100_000 }

export function whatIfTank(p: WhatIfParams): TankInput {
  return {
    id: 'whatif-tank', tag: 'What-if tank', xM: 0, yM: 0,
    heightM: p.tankHeightM, diameterM: p.tankDiameterM,
    material: 'frp', contents: 'crude', flammableVapourSpace: true, chemicalFlashPointC: null,
    components: [{ componentClass: 'sharp_device', count: 1, heightM: p.tankHeightM }],
    shieldRatingKa: p.shieldKa > 0 ? p.shieldKa : null,
    vapourControl: false,
    ...NOMINAL_VALUES,
  }
}

export function whatIfSite(p: WhatIfParams): SiteInput {
  return {
    id: 'whatif-site', name: 'What-if', flashDensity: p.flashDensity,
    tanks: [whatIfTank(p)],
    structures: p.mastHeightM > 0 ? [{ id: 'whatif-mast', kind: 'mast', xM: p.mastDistanceM, yM: 0, heightM: p.mastHeightM, radiusM: 0.3 }] : [],
  }
}

export function whatIfAssumptions(p: WhatIfParams) {
  return parseAssumptions({ currentLaw: p.currentLaw, thresholds: { sharp_device: { u50Kv: p.u50Kv, sigma: p.sigma } } })
}

/** The deterministic figures for one set of parameters (e.g. the starting point the panel compares with). */
export function whatIfFigures(p: WhatIfParams): WhatIfResult {
  const q = isolatedTankQuadrature(whatIfTank(p), p.flashDensity, whatIfAssumptions(p))
  return { sparkingPerYear: q.sparkingPerYear, directPerYear: q.directPerYear, ignitionPerYear: q.ignitionPerYear }
}

const ranged = (e: { rate: number, lo: number, hi: number }): RangedFigure => ({ value: e.rate, lo: e.lo, hi: e.hi })

export function useWhatIf(params: Ref<WhatIfParams>, options: { debounceMs?: number, checkDelayMs?: number } = {}) {
  const result = ref<WhatIfResult | null>(null)
  const grid = shallowRef<TankSparkingGrid | null>(null)
  const check = ref<WhatIfCheck | null>(null)
  const computeMs = ref<number | null>(null)
  const checkMs = ref<number | null>(null)
  const checking = ref(false)
  const error = ref<string | null>(null)
  let fastTimer: ReturnType<typeof setTimeout> | undefined
  let checkTimer: ReturnType<typeof setTimeout> | undefined

  function computeFast() {
    const started = performance.now()
    try {
      const p = params.value
      const assumptions = whatIfAssumptions(p)
      const tank = whatIfTank(p)
      const q = isolatedTankQuadrature(tank, p.flashDensity, assumptions)
      const h = tankSparkingHeatmap(tank, whatIfSite(p), assumptions, WHATIF_GRID)
      result.value = { sparkingPerYear: q.sparkingPerYear, directPerYear: q.directPerYear, ignitionPerYear: q.ignitionPerYear }
      grid.value = toSparkingGrid(h)
      error.value = null
    }
    catch (e) {
      error.value = e instanceof Error ? e.message : String(e)
    }
    computeMs.value = performance.now() - started
  }

  function computeCheck() {
    const started = performance.now()
    try {
      const p = params.value
      const r = simulateSiteFrequency(whatIfSite(p), whatIfAssumptions(p), { runSeed: 'what-if', targetRse: 0.05, maxSamplesPerTank: 40_000 })
      const t = r.tanks[0]!
      check.value = { sparking: ranged(t.sparking), direct: ranged(t.direct), ignition: ranged(t.ignition), samples: t.samples }
    }
    catch (e) {
      check.value = null
      error.value = e instanceof Error ? e.message : String(e)
    }
    checkMs.value = performance.now() - started
    checking.value = false
  }

  function schedule() {
    clearTimeout(fastTimer)
    clearTimeout(checkTimer)
    checking.value = true
    fastTimer = setTimeout(computeFast, options.debounceMs ?? 30)
    checkTimer = setTimeout(computeCheck, options.checkDelayMs ?? 350)
  }

  onMounted(() => {
    computeFast()
    checking.value = true
    checkTimer = setTimeout(computeCheck, 50)
  })
  watch(params, schedule, { deep: true })
  onBeforeUnmount(() => { clearTimeout(fastTimer); clearTimeout(checkTimer) })

  return { result, grid, check, computeMs, checkMs, checking, error, engineVersion: ENGINE_VERSION as string }
}
