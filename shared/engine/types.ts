// Data contract between the risk engine and the rest of Stormledger.
// The inventory and run layers map database rows to these shapes; keep the names stable.
// Units everywhere: current kA, length m, potential kV, flash density flashes/km²/yr,
// frequencies per year, money in the organisation's currency.

export type ComponentClass = 'sharp_device' | 'grounded_pipe' | 'rounded_conductor' | 'carbon_fibre'
// sharp-edged devices (floats, gauges with points) U50 70 kV; grounded metal pipe 100 kV;
// rounded or enclosed conductor 140 kV; carbon-fibre part 90 kV; σ 0.3 (MODEL.md §4, illustrative)

export type TankMaterial = 'frp' | 'polyethylene' | 'steel' | 'other'
export type Contents = 'crude' | 'condensate' | 'produced_water' | 'fresh_water' | 'chemical'
export type StructureKind = 'mast' | 'stack' | 'ogw_support' | 'building'

export const COMPONENT_CLASSES: readonly ComponentClass[] = ['sharp_device', 'grounded_pipe', 'rounded_conductor', 'carbon_fibre']
export const TANK_MATERIALS: readonly TankMaterial[] = ['frp', 'polyethylene', 'steel', 'other']
export const CONTENTS: readonly Contents[] = ['crude', 'condensate', 'produced_water', 'fresh_water', 'chemical']
export const STRUCTURE_KINDS: readonly StructureKind[] = ['mast', 'stack', 'ogw_support', 'building']

export interface ComponentInput { componentClass: ComponentClass; count: number; heightM: number }

export interface TankInput {
  id: string; tag: string; xM: number; yM: number; heightM: number; diameterM: number
  material: TankMaterial; contents: Contents; flammableVapourSpace: boolean
  chemicalFlashPointC?: number | null          // only for contents 'chemical'
  components: ComponentInput[]
  shieldRatingKa: number | null                // induced-sparking shield: no sparking for I ≤ rating
  vapourControl: boolean                       // scales ignition probability by the assumption set's factor
  replacementValue: number; contentsValue: number; cleanupCost: number; interruptionCost: number // money
}

export interface StructureInput { id: string; kind: StructureKind; xM: number; yM: number; heightM: number; radiusM: number }

export interface SiteInput {
  id: string; name: string
  flashDensity: number // Ng, flashes/km²/yr, already resolved
  tanks: TankInput[]; structures: StructureInput[]
}

export type AttachmentModel = 'egm' | 'collection_area'

/**
 * A rate per year with its standard error and 95 % interval (normal approximation, floored at 0).
 * `upperBoundOnly`: the figure was stopped by the negligible-rate rule; only `hi` is meant (an upper
 * bound, `lo` is 0), not a two-sided interval.
 */
export interface Estimate { rate: number; se: number; lo: number; hi: number; upperBoundOnly?: boolean }

/** A simulated count over a number of years with the exact Poisson (Garwood) 95 % interval, as rates per year. */
export interface CountEstimate { count: number; rate: number; lo: number; hi: number }
