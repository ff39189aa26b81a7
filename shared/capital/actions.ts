// Mitigation options and what each does to the engine's input (MODEL.md §4). Pure: used by the
// scenario worker, the routes and the browser alike.
import type { ComponentClass, SiteInput, TankInput } from '../engine/types'

export type MitigationKind = 'shield' | 'remove_class' | 'steel_tank' | 'vapour_control' | 'mast' | 'grounding' | 'static_dissipator'
export const MITIGATION_KINDS: readonly MitigationKind[] = ['shield', 'remove_class', 'steel_tank', 'vapour_control', 'mast', 'grounding', 'static_dissipator']

/** Kinds that act on one tank; a mast acts on the site. */
export const TANK_KINDS: readonly MitigationKind[] = ['shield', 'remove_class', 'steel_tank', 'vapour_control', 'grounding', 'static_dissipator']

export const MITIGATION_LABELS: Record<MitigationKind, string> = {
  shield: 'Induced-sparking shield',
  remove_class: 'Replace internal conducting parts with non-conducting ones',
  steel_tank: 'Replace the tank with a steel tank',
  vapour_control: 'Vapour control',
  mast: 'Lightning mast',
  grounding: 'Grounding and bonding upgrade',
  static_dissipator: 'Static dissipator',
}

/** Why an option leaves the model unchanged (MODEL.md §4: impulse tests show no effect on induced sparking). */
export const NO_EFFECT_REASON = 'Grounding, bonding and static dissipators do not change the potential induced on the '
  + 'conducting parts inside a non-conducting tank, so they do not reduce induced sparking; the model records them at '
  + 'their cost with no reduction.'

export function hasModelEffect(kind: MitigationKind): boolean {
  return kind !== 'grounding' && kind !== 'static_dissipator'
}

/** The parameters an option carries into the model (besides its cost rule). */
export interface OptionEffect {
  kind: MitigationKind
  /** shield: rating in kA (no sparking for I ≤ rating). */
  shieldRatingKa?: number | null
  /** remove_class: the component class replaced by non-conducting parts. */
  componentClass?: ComponentClass | null
  /** mast: height and radius in m. */
  mastHeightM?: number | null
  mastRadiusM?: number | null
}

/** One candidate action: an option applied to a tank (or, for a mast, placed on a site). */
export interface ActionEffect {
  id: string
  option: OptionEffect
  tankId: string | null
  /** mast position in site coordinates, m. */
  mastXM?: number | null
  mastYM?: number | null
}

/** The structure id a mast action adds: new, stable, derived from the action so runs reproduce. */
export function mastStructureId(actionId: string): string {
  return `capital-mast/${actionId}`
}

function applyToTank(tank: TankInput, option: OptionEffect): TankInput {
  switch (option.kind) {
    case 'shield': {
      const rating = option.shieldRatingKa ?? 0
      // A better shield already fitted stays: a new one never lowers the rating.
      return { ...tank, shieldRatingKa: Math.max(tank.shieldRatingKa ?? 0, rating) }
    }
    case 'remove_class':
      return { ...tank, components: tank.components.filter(c => c.componentClass !== option.componentClass) }
    case 'steel_tank':
      return { ...tank, material: 'steel' }
    case 'vapour_control':
      return { ...tank, vapourControl: true }
    default:
      return tank
  }
}

/** The site with every action applied, in order; actions on other sites are ignored. Never mutates. */
export function applyActions(site: SiteInput, actions: readonly ActionEffect[]): SiteInput {
  let tanks = site.tanks
  const structures = [...site.structures]
  for (const action of actions) {
    if (action.option.kind === 'mast') {
      structures.push({
        id: mastStructureId(action.id), kind: 'mast',
        xM: action.mastXM ?? 0, yM: action.mastYM ?? 0,
        heightM: action.option.mastHeightM ?? 30, radiusM: action.option.mastRadiusM ?? 0.3,
      })
      continue
    }
    if (!hasModelEffect(action.option.kind) || action.tankId === null) continue
    tanks = tanks.map(t => (t.id === action.tankId ? applyToTank(t, action.option) : t))
  }
  return { ...site, tanks, structures }
}
