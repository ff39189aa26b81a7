// A generated, demo-like portfolio for the engine benchmark: production and terminal sites with a
// handful of non-conducting tanks each, some steel, some shielded, some with a mast or a stack.
// Every value is invented (PRODUCT.md: invented numbers belong to the demo only).
import type { ComponentClass, ComponentInput, Contents, SiteInput, StructureInput, TankInput, TankMaterial } from '../shared/engine/types'
import { createStream } from '../shared/engine/random'
import type { UniformStream } from '../shared/engine/random'

const MATERIALS: TankMaterial[] = ['frp', 'frp', 'frp', 'polyethylene', 'polyethylene', 'steel', 'other']
const CONTENTS: Contents[] = ['crude', 'condensate', 'produced_water', 'produced_water', 'fresh_water', 'chemical']
const CLASSES: ComponentClass[] = ['sharp_device', 'grounded_pipe', 'rounded_conductor', 'carbon_fibre']

const pick = <T>(rand: UniformStream, list: readonly T[]): T => list[Math.floor(rand() * list.length)]!
const between = (rand: UniformStream, lo: number, hi: number) => lo + (hi - lo) * rand()

function components(rand: UniformStream, tankHeight: number): ComponentInput[] {
  const kinds = 1 + Math.floor(rand() * 3)
  const chosen = new Set<ComponentClass>()
  while (chosen.size < kinds) chosen.add(pick(rand, CLASSES))
  return [...chosen].map((componentClass) => ({ componentClass, count: 1 + Math.floor(rand() * 3), heightM: Math.round(between(rand, 0.2, 0.9) * tankHeight * 10) / 10 }))
}

function tank(rand: UniformStream, siteId: string, index: number, x: number, y: number): TankInput {
  const heightM = Math.round(between(rand, 4, 10) * 10) / 10
  const contents = pick(rand, CONTENTS)
  return {
    id: `${siteId}-t${index}`, tag: `TK-${100 + index}`, xM: x, yM: y, heightM, diameterM: Math.round(between(rand, 2.5, 4.5) * 10) / 10,
    material: pick(rand, MATERIALS), contents, flammableVapourSpace: contents !== 'fresh_water' && rand() < 0.9,
    chemicalFlashPointC: contents === 'chemical' ? Math.round(between(rand, 10, 120)) : null,
    components: components(rand, heightM),
    shieldRatingKa: rand() < 0.2 ? Math.round(between(rand, 30, 150)) : null,
    vapourControl: rand() < 0.25,
    replacementValue: Math.round(between(rand, 40_000, 250_000)), contentsValue: Math.round(between(rand, 10_000, 400_000)),
    cleanupCost: Math.round(between(rand, 20_000, 300_000)), interruptionCost: Math.round(between(rand, 0, 500_000)),
  }
}

function structures(rand: UniformStream, siteId: string, span: number): StructureInput[] {
  const out: StructureInput[] = []
  if (rand() < 0.3) out.push({ id: `${siteId}-mast`, kind: 'mast', xM: span + between(rand, 5, 20), yM: between(rand, -10, 10), heightM: Math.round(between(rand, 15, 30)), radiusM: 0.3 })
  if (rand() < 0.15) out.push({ id: `${siteId}-stack`, kind: 'stack', xM: between(rand, -30, -10), yM: between(rand, -20, 20), heightM: Math.round(between(rand, 12, 25)), radiusM: 0.8 })
  return out
}

/** One site with `tankCount` tanks in rows, spacing 8–15 m, Ng log-uniform in 0.5–8 flashes/km²/yr. */
export function generateSite(rand: UniformStream, index: number, tankCount: number): SiteInput {
  const id = `site-${String(index).padStart(4, '0')}`
  const spacing = between(rand, 8, 15)
  const perRow = Math.ceil(Math.sqrt(tankCount))
  const tanks = Array.from({ length: tankCount }, (_, k) => tank(rand, id, k, (k % perRow) * spacing, Math.floor(k / perRow) * spacing))
  return { id, name: `Generated site ${index}`, flashDensity: Math.round(0.5 * Math.pow(16, rand()) * 100) / 100, tanks, structures: structures(rand, id, perRow * spacing) }
}

/** `siteCount` sites with `tankCount` tanks in all (3–7 per site, cycling, topped up on the last). */
export function generatePortfolio(siteCount: number, tankCount: number, seed = 'bench'): SiteInput[] {
  const rand = createStream(seed, 'portfolio', 'generate')
  const sizes = Array.from({ length: siteCount }, (_, i) => 3 + (i % 5))
  let surplus = sizes.reduce((a, b) => a + b, 0) - tankCount
  for (let i = siteCount - 1; surplus !== 0 && i >= 0; i--) {
    const step = surplus > 0 ? Math.min(surplus, sizes[i]! - 1) : Math.max(surplus, -10)
    sizes[i] = sizes[i]! - step
    surplus -= step
  }
  return sizes.map((n, i) => generateSite(rand, i, n))
}
