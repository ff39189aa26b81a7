// Stored shapes of a run with assumption draws (issue "How sure are we"): the 5 / 50 / 95 % points
// of each figure across the draws ("assumption band"), kept apart from the simulation interval, and
// the sensitivity indices. Runs without draws store null and show "no assumption draws".
import type { DrawBands } from '../engine/draw-figures'
import type { SensitivityResult } from '../engine/sensitivity'
import type { YearDrawBands } from '../engine/year-draws'

export type { DrawBand, DrawBands } from '../engine/draw-figures'
export type { SensitivityIndex, SensitivityResult } from '../engine/sensitivity'
export type { YearDrawBands } from '../engine/year-draws'

export interface StoredTankDraws { draws: number; bands: DrawBands }

export interface StoredSiteDraws {
  draws: number
  bands: DrawBands
  sensitivity: SensitivityResult[]
  /** Shared flashes of the site kept for the draws. */
  flashes: number
  /** Per evaluation of the plan (central, A, B, A_B^g): the site's figures, base64 of Float32 (the portfolio adds them); direct and sparking: central and A only. */
  series: { direct: string; sparking: string; ignition: string; expectedAnnualLoss: string }
  /**
   * Simulated-years runs: the bands of AAL, expected fires and the return-period losses (each draw
   * re-simulated over `years.years` years on the central streams), and the re-simulated year-loss
   * tables the portfolio adds: base64 of Float32 quadruples (evaluation, year, year loss, largest
   * event loss) for the years with a loss. Frequency runs: absent (sensitivity is for frequency runs only).
   */
  years?: YearDrawBands
  yearTables?: string
}

export interface StoredPortfolioDraws {
  draws: number
  bands: DrawBands
  sensitivity: SensitivityResult[]
  /** Evaluations of the design (1 + K + N·factors, N = ⌊K/2⌋; 1 + K·(2 + factors) for runs before engine 2.5.0) and drawn damage-ratio sds clamped to stay valid. */
  evaluations: number
  clamped: number
  /** Illustrative ranges on assumptions the draws cannot carry, left out (absent for none). */
  leftOut?: { path: string; reason: string }[]
  /** Simulated-years runs: the portfolio's bands of AAL, expected fires and the return-period losses. */
  years?: YearDrawBands
}

/** What the screens read: bands without the series. */
export interface DrawsView { draws: number; bands: DrawBands; sensitivity?: SensitivityResult[]; leftOut?: { path: string; reason: string }[]; years?: YearDrawBands }
