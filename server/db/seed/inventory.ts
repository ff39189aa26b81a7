// Demo inventory (all invented): two operators in a semi-arid oil-and-gas basin around 31–33° N,
// 101–104° W, and an insurer that keeps its own copies of the sites it insures.
//   Dunmere Basin Operating — 40 sites, about 200 tanks; shares its "Dunmere fleet" portfolio
//     read-only with Cobalt Ridge Assurance.
//   Sablefork Petroleum — 15 sites; shares "Sablefork fleet" read-only with Quillfeather Brokerage.
//   Cobalt Ridge Assurance — its own copies of both operators' sites (operator_name says whose),
//     in the portfolio "Basin energy book": an insurer's book is its own record of what it insures.
// Random numbers are seeded, so every database gets the same scenario.
import { eq } from 'drizzle-orm'
import seedrandom from 'seedrandom'
import type { Database } from '../index'
import { organisations, portfolioShares, portfolioSites, portfolios, siteStructures, sites, tankComponents, tanks, type OrganisationKind } from '../schema'
import type { ComponentClass, StructureKind, TankContents, TankMaterial } from '../../../shared/schemas/inventory'

export const DEMO_ORGANISATIONS = {
  insurer: { name: 'Cobalt Ridge Assurance', kind: 'insurer' },
  broker: { name: 'Quillfeather Brokerage', kind: 'broker' },
  operatorA: { name: 'Dunmere Basin Operating', kind: 'operator' },
  operatorB: { name: 'Sablefork Petroleum', kind: 'operator' },
} as const satisfies Record<string, { name: string, kind: OrganisationKind }>

const PLACES = ['Coyote Draw', 'Yucca Flat', 'Alkali Bend', 'Sandhill', 'Tobosa Mesa', 'Creosote Ridge', 'Javelina Wells', 'Cholla Point', 'Gypsum Hollow', 'Saltgrass Lake',
  'Dry Lake', 'Whitecap Rim', 'Lone Sotol', 'Kestrel Flat', 'Buckthorn', 'Quail Run', 'Sidewinder', 'Caliche Knob', 'Mesquite Fork', 'Dusty Spur',
  'Ocotillo', 'Horsehead Tank', 'Shinnery', 'Roadrunner', 'Windmill Draw', 'Cinder Butte', 'Playa Nine', 'Tumbleweed', 'Gravel Pit', 'Bitterwater',
  'Juniper Gap', 'Sagebrush', 'Pronghorn', 'Flint Ridge', 'Copperhead', 'Red Clay', 'Sotol Creek', 'Hackberry', 'Prickly Pear', 'Cottonwood Seep',
  'Antelope Flat', 'Greasewood', 'Rattlesnake Butte', 'Lechuguilla', 'Chaparral', 'Dove Creek', 'Badger Hole', 'Salt Cedar', 'Owl Canyon', 'Thistle Draw',
  'Cactus Flat', 'Skunk Hollow', 'Bluestem', 'Yellow House', 'Ironwood']
const FACILITIES = ['Battery', 'Tank Battery', 'Central Facility', 'Gathering Station', 'Satellite', 'Water Station']

interface DemoTank {
  externalId: string, tag: string, material: TankMaterial, heightM: number, diameterM: number, xM: number, yM: number
  contents: TankContents, flammableVapourSpace: boolean, chemicalFlashPointC: number | null, grounding: 'none' | 'single' | 'multiple'
  shieldRatingKa: number | null, vapourControl: boolean, staticDissipator: boolean, bondingUpgrade: boolean
  replacementValue: number, contentsValue: number, cleanupCost: number, interruptionCost: number
  components: { componentClass: ComponentClass, count: number, heightM: number }[]
}
interface DemoStructure { externalId: string, kind: StructureKind, label: string, xM: number, yM: number, heightM: number, radiusM: number }
interface DemoSite {
  externalId: string, name: string, operatorName: string, latitudeDeg: number, longitudeDeg: number
  flashDensityPerKm2Yr: number | null, thunderstormDaysPerYr: number | null, locationNotes: string
  insuredPropertyValue: number, insuredInterruptionValue: number, tanks: DemoTank[], structures: DemoStructure[]
}

const round = (x: number, digits: number) => Math.round(x * 10 ** digits) / 10 ** digits

function pick<T>(rng: () => number, items: readonly (readonly [T, number])[]): T {
  const total = items.reduce((s, [, w]) => s + w, 0)
  let u = rng() * total
  for (const [item, w] of items) { if ((u -= w) < 0) return item }
  return items[items.length - 1]![0]
}

/** A smooth invented field of flash density over the basin, higher to the east and south-east. */
function basinFlashDensity(lat: number, lon: number, rng: () => number): number {
  const east = (lon + 104) / 3 // 0 at 104° W, 1 at 101° W
  const south = (33 - lat) / 2
  return round(Math.min(8, Math.max(2, 2 + 4.2 * east + 1.3 * south + (rng() - 0.5) * 0.8)), 2)
}

function makeTanks(rng: () => number, sitePrefix: string, count: number): DemoTank[] {
  const out: DemoTank[] = []
  let x = -((count - 1) * 9) / 2
  for (let i = 0; i < count; i++) {
    const contents = pick<TankContents>(rng, [['crude', 30], ['condensate', 15], ['produced_water', 35], ['fresh_water', 10], ['chemical', 10]])
    const material = contents === 'fresh_water' || contents === 'chemical'
      ? pick<TankMaterial>(rng, [['polyethylene', 60], ['frp', 35], ['other', 5]])
      : pick<TankMaterial>(rng, [['frp', 65], ['steel', 25], ['polyethylene', 5], ['other', 5]])
    const heightM = round(3 + rng() * 7, 1)
    const diameterM = round(2.5 + rng() * 4, 1)
    const chemicalFlashPointC = contents === 'chemical' ? round(20 + rng() * 80, 0) : null
    const flammableVapourSpace = contents === 'crude' || contents === 'condensate' ? true
      : contents === 'produced_water' ? rng() < 0.5
        : contents === 'chemical' ? (chemicalFlashPointC ?? 100) < 60 : false
    const components: DemoTank['components'] = []
    if (material !== 'steel') {
      components.push({ componentClass: 'sharp_device', count: 1 + Math.floor(rng() * 2), heightM: round(heightM * (0.7 + rng() * 0.25), 1) })
      components.push({ componentClass: 'grounded_pipe', count: 1 + Math.floor(rng() * 3), heightM: round(heightM * (0.85 + rng() * 0.15), 1) })
      if (rng() < 0.4) components.push({ componentClass: 'rounded_conductor', count: 1, heightM: round(heightM * (0.5 + rng() * 0.4), 1) })
      if (rng() < 0.1) components.push({ componentClass: 'carbon_fibre', count: 1, heightM: round(heightM * (0.3 + rng() * 0.5), 1) })
    }
    const shielded = material !== 'steel' && rng() < 0.12
    const perM3 = contents === 'crude' ? 420 : contents === 'condensate' ? 480 : contents === 'chemical' ? 900 : 0
    const volume = Math.PI * (diameterM / 2) ** 2 * heightM
    out.push({
      externalId: `${sitePrefix}-T${String(i + 1).padStart(2, '0')}`,
      tag: `TK-${100 + i + 1}`,
      material, heightM, diameterM,
      xM: round(x + (rng() - 0.5) * 2, 1), yM: round((rng() - 0.5) * 6, 1),
      contents, flammableVapourSpace, chemicalFlashPointC,
      grounding: pick(rng, [['none', 15], ['single', 60], ['multiple', 25]] as const),
      shieldRatingKa: shielded ? pick(rng, [[40, 1], [60, 2], [100, 1], [150, 1]] as const) : null,
      vapourControl: rng() < 0.2,
      staticDissipator: rng() < 0.15,
      bondingUpgrade: rng() < 0.2,
      replacementValue: round(40_000 + volume * 900 + rng() * 30_000, -2),
      contentsValue: round(volume * perM3 * 0.7, -2),
      cleanupCost: round(20_000 + rng() * 130_000, -2),
      interruptionCost: round(10_000 + rng() * 190_000, -2),
      components,
    })
    x += diameterM / 2 + 3 + (out[i + 1]?.diameterM ?? 4.5) / 2
  }
  return out
}

function makeStructures(rng: () => number, sitePrefix: string, spanM: number): DemoStructure[] {
  const out: DemoStructure[] = []
  let n = 0
  const id = () => `${sitePrefix}-S${++n}`
  if (rng() < 0.4) out.push({ externalId: id(), kind: 'mast', label: 'Radio mast', xM: round(spanM / 2 + 15 + rng() * 20, 1), yM: round(10 + rng() * 15, 1), heightM: round(15 + rng() * 15, 1), radiusM: 0.5 })
  if (rng() < 0.22) {
    const h = round(12 + rng() * 6, 1)
    out.push({ externalId: id(), kind: 'ogw_support', label: 'Overhead ground wire pole (west)', xM: round(-spanM / 2 - 6, 1), yM: -8, heightM: h, radiusM: 0.3 })
    out.push({ externalId: id(), kind: 'ogw_support', label: 'Overhead ground wire pole (east)', xM: round(spanM / 2 + 6, 1), yM: -8, heightM: h, radiusM: 0.3 })
  }
  if (rng() < 0.12) out.push({ externalId: id(), kind: 'stack', label: 'Flare stack', xM: round(-spanM / 2 - 25 - rng() * 15, 1), yM: round(20 + rng() * 10, 1), heightM: round(10 + rng() * 10, 1), radiusM: 0.4 })
  if (rng() < 0.15) out.push({ externalId: id(), kind: 'building', label: 'Control building', xM: round(-10 + rng() * 20, 1), yM: round(-25 - rng() * 10, 1), heightM: round(4 + rng() * 2, 1), radiusM: 6 })
  return out
}

export function demoSites(operatorName: string, prefix: string, count: number, tankTarget: number, region: { lat: [number, number], lon: [number, number] }, rng: () => number, placeOffset: number, useThunderstormDays: number): DemoSite[] {
  const out: DemoSite[] = []
  let tanksLeft = tankTarget
  for (let i = 0; i < count; i++) {
    const lat = round(region.lat[0] + rng() * (region.lat[1] - region.lat[0]), 4)
    const lon = round(region.lon[0] + rng() * (region.lon[1] - region.lon[0]), 4)
    const remainingSites = count - i
    const nTanks = i === count - 1 ? Math.max(1, tanksLeft) : Math.max(2, Math.min(9, Math.round(tanksLeft / remainingSites + (rng() - 0.5) * 5)))
    tanksLeft -= nTanks
    const externalId = `${prefix}-${String(i + 1).padStart(3, '0')}`
    const siteTanks = makeTanks(rng, externalId, nTanks)
    const span = siteTanks.length > 0 ? Math.max(...siteTanks.map(t => t.xM)) - Math.min(...siteTanks.map(t => t.xM)) : 10
    const ng = basinFlashDensity(lat, lon, rng)
    const byDays = rng() < useThunderstormDays
    out.push({
      externalId,
      name: `${PLACES[(placeOffset + i) % PLACES.length]} ${FACILITIES[Math.floor(rng() * FACILITIES.length)]}`,
      operatorName,
      latitudeDeg: lat, longitudeDeg: lon,
      // Td chosen so that Anderson's Ng = 0.04·Td^1.25 matches the basin field.
      flashDensityPerKm2Yr: byDays ? null : ng,
      thunderstormDaysPerYr: byDays ? round((ng / 0.04) ** (1 / 1.25), 0) : null,
      locationNotes: `Lease road ${1 + Math.floor(rng() * 60)}, ${round(1 + rng() * 9, 1)} km from the county road.`,
      insuredPropertyValue: round(siteTanks.reduce((s, t) => s + t.replacementValue, 0) * 1.6, -3),
      insuredInterruptionValue: round(siteTanks.reduce((s, t) => s + t.interruptionCost, 0), -3),
      tanks: siteTanks,
      structures: makeStructures(rng, externalId, span),
    })
  }
  return out
}

async function organisationId(db: Database, org: { name: string, kind: OrganisationKind }): Promise<string> {
  const [found] = await db.select({ id: organisations.id }).from(organisations).where(eq(organisations.name, org.name))
  if (found) return found.id
  const [created] = await db.insert(organisations).values({ name: org.name, kind: org.kind }).returning({ id: organisations.id })
  return created!.id
}

/** Inserts sites with their tanks, components and structures; returns the new site ids in order. */
export async function insertSites(db: Database, orgId: string, list: DemoSite[]): Promise<string[]> {
  if (list.length === 0) return []
  const siteRows = await db.insert(sites).values(list.map(({ tanks: _t, structures: _s, ...s }) => ({ ...s, organisationId: orgId }))).returning({ id: sites.id })
  const tankValues = list.flatMap((s, i) => s.tanks.map(({ components: _c, ...t }) => ({ ...t, siteId: siteRows[i]!.id })))
  const tankRows = tankValues.length === 0 ? [] : await db.insert(tanks).values(tankValues).returning({ id: tanks.id })
  const flatTanks = list.flatMap(s => s.tanks)
  const componentValues = flatTanks.flatMap((t, i) => t.components.map(c => ({ ...c, tankId: tankRows[i]!.id })))
  if (componentValues.length > 0) await db.insert(tankComponents).values(componentValues)
  const structureValues = list.flatMap((s, i) => s.structures.map(st => ({ ...st, siteId: siteRows[i]!.id })))
  if (structureValues.length > 0) await db.insert(siteStructures).values(structureValues)
  return siteRows.map(r => r.id)
}

async function portfolioWith(db: Database, orgId: string, name: string, description: string, siteIds: string[]): Promise<string> {
  const [p] = await db.insert(portfolios).values({ organisationId: orgId, name, description }).returning({ id: portfolios.id })
  if (siteIds.length > 0) await db.insert(portfolioSites).values(siteIds.map(siteId => ({ portfolioId: p!.id, siteId })))
  return p!.id
}

export async function seedInventory(db: Database): Promise<void> {
  const rng = seedrandom('stormledger demo inventory v1')
  const insurer = await organisationId(db, DEMO_ORGANISATIONS.insurer)
  const broker = await organisationId(db, DEMO_ORGANISATIONS.broker)
  const dunmere = await organisationId(db, DEMO_ORGANISATIONS.operatorA)
  const sablefork = await organisationId(db, DEMO_ORGANISATIONS.operatorB)

  const dunmereSites = demoSites(DEMO_ORGANISATIONS.operatorA.name, 'DBO', 40, 200, { lat: [31.2, 32.9], lon: [101.3, 103.9].map(v => -v).reverse() as [number, number] }, rng, 0, 0.1)
  const sableforkSites = demoSites(DEMO_ORGANISATIONS.operatorB.name, 'SFP', 15, 72, { lat: [31.0, 32.2], lon: [-102.6, -101.1] }, rng, 40, 0.3)
  const dunmereIds = await insertSites(db, dunmere, dunmereSites)
  const sableforkIds = await insertSites(db, sablefork, sableforkSites)
  const dunmereFleet = await portfolioWith(db, dunmere, 'Dunmere fleet', 'Every Dunmere Basin Operating site.', dunmereIds)
  await portfolioWith(db, dunmere, 'Northern leases', 'Sites north of 32° N.', dunmereIds.filter((_, i) => dunmereSites[i]!.latitudeDeg >= 32))
  const sableforkFleet = await portfolioWith(db, sablefork, 'Sablefork fleet', 'Every Sablefork Petroleum site.', sableforkIds)
  await db.insert(portfolioShares).values([
    { portfolioId: dunmereFleet, organisationId: insurer },
    { portfolioId: sableforkFleet, organisationId: broker },
  ])

  // The insurer's own copies: its references, the same facts, operator_name naming the operator.
  const copies = [...dunmereSites, ...sableforkSites].map((s, i) => ({ ...s, externalId: `CRA-${String(1001 + i)}`, locationNotes: `Insured as ${s.externalId}. ${s.locationNotes}` }))
  const insurerIds = await insertSites(db, insurer, copies)
  await portfolioWith(db, insurer, 'Basin energy book', 'Insured tank batteries of Dunmere Basin Operating and Sablefork Petroleum.', insurerIds)
}
