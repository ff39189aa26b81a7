// "What to calibrate next": the ranking of variance-based sensitivity indices and where each
// assumption is calibrated (issue "How sure are we"). Pure functions for the SensitivityChart.
//
// The index shapes are those the engine's sensitivity estimator returns (shared/engine/sensitivity.ts).
import type { IndexEstimate, SensitivityIndex, SensitivityResult } from '../engine/sensitivity'
import { CURRENT_LAW_PATHS, FLASH_DENSITY_FACTOR_PATH } from '../engine/uncertainty-ranges'

export type { SensitivityIndex, SensitivityResult } from '../engine/sensitivity'

/** Whiskers at ±2 standard errors (about 95 % for a normal sampling error). */
export const WHISKER_SE = 2

export interface RankedIndex extends SensitivityIndex {
  rank: number
  /** Whisker ends, estimate ∓ 2·se. */
  totalRange: [number, number]
  firstRange: [number, number]
  /** The estimate lies within its sampling error of 0 (|estimate| ≤ 2·se). */
  totalWithinNoise: boolean
  firstWithinNoise: boolean
}

const withinNoise = (e: IndexEstimate) => Math.abs(e.estimate) <= WHISKER_SE * e.se

/**
 * Ranked by total effect, largest first (the assumption that, fixed at its true value, would remove
 * the most variance); ties by first order, then by label, so the order never depends on the input's.
 */
export function rankIndices(result: SensitivityResult): RankedIndex[] {
  return [...result.indices]
    .sort((a, b) => b.totalEffect.estimate - a.totalEffect.estimate || b.firstOrder.estimate - a.firstOrder.estimate || a.label.localeCompare(b.label))
    .map((index, k) => ({
      ...index,
      rank: k + 1,
      totalRange: [index.totalEffect.estimate - WHISKER_SE * index.totalEffect.se, index.totalEffect.estimate + WHISKER_SE * index.totalEffect.se],
      firstRange: [index.firstOrder.estimate - WHISKER_SE * index.firstOrder.se, index.firstOrder.estimate + WHISKER_SE * index.firstOrder.se],
      totalWithinNoise: withinNoise(index.totalEffect),
      firstWithinNoise: withinNoise(index.firstOrder),
    }))
}

export interface CalibrationPage { to: string; title: string }

const IMPULSE: CalibrationPage = { to: '/calibration/impulse', title: 'Calibration from impulse test records' }
const LIGHTNING: CalibrationPage = { to: '/calibration/lightning', title: 'Calibration from lightning-location records' }

/**
 * The calibration page that estimates an assumption, or null when none does: sparking levels and
 * their scatter come from impulse tests; the current law and the flash density from
 * lightning-location records (the lightning calibration fits the log-normal law; it also replaces
 * a power law, which it turns into the log-normal).
 */
export function calibrationPageFor(path: string): CalibrationPage | null {
  // A group (its member paths joined by " + "): the page of its first member that has one.
  if (path.includes(' + ')) {
    for (const p of path.split(' + ')) {
      const page = calibrationPageFor(p)
      if (page) return page
    }
    return null
  }
  if (/^thresholds\.[a-z_]+\.(u50Kv|sigma)$/.test(path)) return IMPULSE
  if (CURRENT_LAW_PATHS.includes(path) || path === FLASH_DENSITY_FACTOR_PATH) return LIGHTNING
  return null
}

const METRIC_LABELS: Record<SensitivityResult['metric'], string> = { expectedFires: 'expected fires per year', aal: 'average annual loss' }

export function metricLabel(metric: SensitivityResult['metric']): string {
  return METRIC_LABELS[metric]
}

/** A readable note for an index whose estimate is within its sampling error of 0, or null. */
export function noiseNote(index: RankedIndex): string | null {
  if (index.totalWithinNoise) return `The total effect of ${index.label} is within its sampling error of 0: it may not matter, or the run has too few base samples to tell.`
  if (index.firstWithinNoise) return `The first-order effect of ${index.label} is within its sampling error of 0: it acts mainly through its interactions with other assumptions.`
  return null
}
