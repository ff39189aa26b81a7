// Small builders for engine tests. Values are invented test inputs, not expected results.
import type { SiteInput, StructureInput, TankInput } from '../../../shared/engine/types'

export function makeTank(over: Partial<TankInput> = {}): TankInput {
  return {
    id: 't1', tag: 'TK-1', xM: 0, yM: 0, heightM: 10, diameterM: 4,
    material: 'frp', contents: 'condensate', flammableVapourSpace: true, chemicalFlashPointC: null,
    components: [{ componentClass: 'sharp_device', count: 1, heightM: 8 }],
    shieldRatingKa: null, vapourControl: false,
    replacementValue: 100_000, contentsValue: 50_000, cleanupCost: 30_000, interruptionCost: 20_000,
    ...over,
  }
}

export function makeSite(tanks: TankInput[], structures: StructureInput[] = [], over: Partial<SiteInput> = {}): SiteInput {
  return { id: 'site-a', name: 'Test site', flashDensity: 4, tanks, structures, ...over }
}

/** Three tanks in a row and a mast: a site where attachment matters. */
export function battery(over: Partial<SiteInput> = {}): SiteInput {
  return makeSite([
    makeTank({ id: 'a', tag: 'A', xM: 0, yM: 0, heightM: 7, diameterM: 3.5 }),
    makeTank({ id: 'b', tag: 'B', xM: 10, yM: 0, heightM: 9, diameterM: 3.5, contents: 'crude', components: [{ componentClass: 'grounded_pipe', count: 2, heightM: 7 }, { componentClass: 'carbon_fibre', count: 1, heightM: 4 }] }),
    makeTank({ id: 'c', tag: 'C', xM: 20, yM: 0, heightM: 6, diameterM: 3, contents: 'produced_water', components: [{ componentClass: 'rounded_conductor', count: 1, heightM: 5 }] }),
  ], [{ id: 'm', kind: 'mast', xM: 10, yM: 14, heightM: 25, radiusM: 0.3 }], over)
}
