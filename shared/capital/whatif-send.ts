// Which catalogue option realises a saved what-if option, as the "Send to capital plan" button first
// offers it (the person may choose another). Pure.
import type { WhatIfParams } from '../results/whatif-params'

export interface CatalogueChoice { id: string, kind: string, name: string, shieldRatingKa: number | null, mastHeightM: number | null, archivedAt?: string | Date | null }

/**
 * A what-if with a mast (height > 0) → the mast option whose height is nearest; with a shield
 * (rating > 0) → the lowest-rated shield at or above the what-if's rating, else the highest-rated one;
 * otherwise none (the person chooses). Archived options are never offered.
 */
export function suggestCatalogueOption(params: Pick<WhatIfParams, 'mastHeightM' | 'shieldKa'>, options: readonly CatalogueChoice[]): CatalogueChoice | null {
  const active = options.filter(o => !o.archivedAt)
  if (params.mastHeightM > 0) {
    const masts = active.filter(o => o.kind === 'mast' && o.mastHeightM !== null)
    return masts.sort((a, b) => Math.abs(a.mastHeightM! - params.mastHeightM) - Math.abs(b.mastHeightM! - params.mastHeightM))[0] ?? null
  }
  if (params.shieldKa > 0) {
    const shields = active.filter(o => o.kind === 'shield' && o.shieldRatingKa !== null).sort((a, b) => a.shieldRatingKa! - b.shieldRatingKa!)
    return shields.find(o => o.shieldRatingKa! >= params.shieldKa) ?? shields.at(-1) ?? null
  }
  return null
}
