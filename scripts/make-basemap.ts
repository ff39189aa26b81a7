// npx tsx scripts/make-basemap.ts — writes the map's place context, public/basemap/context.json:
// Natural Earth 1:50m country boundaries and coastlines (world-atlas 2, Natural Earth 4.1.0, public
// domain) with the United States replaced by its states (us-atlas 3, the U.S. Census Bureau's
// cartographic state boundaries, 2017 edition, public domain), simplified and written as one small GeoJSON
// feature collection that the app registers as an ECharts map. Only this script reads the two
// packages: the app reads the generated file from its own server, never a package or the internet.
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import { resolve } from 'node:path'
import { feature } from 'topojson-client'
import type { GeometryCollection, Topology } from 'topojson-specification'
import { simplifyLine } from '../shared/results/simplify'

const require = createRequire(import.meta.url)
const root = resolve(import.meta.dirname, '..')
/** Douglas–Peucker tolerance in degrees: 0.04° is about 4 km, below a pixel at the zoom that shows a whole basin. */
const TOLERANCE_DEG = 0.04
const DECIMALS = 2

type Named = { name: string }
type Arc = [number, number][]

function readTopology(path: string): Topology {
  return JSON.parse(readFileSync(require.resolve(path), 'utf8')) as Topology
}

/** Decodes the quantised arcs to degrees and simplifies each arc once, so shared borders stay shared. */
function simplifiedTopology(t: Topology): Topology {
  const tr = t.transform
  const arcs = (t.arcs as Arc[]).map((arc) => {
    let x = 0
    let y = 0
    const points = arc.map(([dx, dy]) => {
      if (!tr) return [dx, dy] as [number, number]
      x += dx; y += dy
      return [x * tr.scale[0] + tr.translate[0], y * tr.scale[1] + tr.translate[1]] as [number, number]
    })
    const factor = 10 ** DECIMALS
    return simplifyLine(points, TOLERANCE_DEG).map(([a, b]) => [Math.round(a * factor) / factor, Math.round(b * factor) / factor])
  })
  return { ...t, transform: undefined, arcs } as unknown as Topology
}

const world = simplifiedTopology(readTopology('world-atlas/countries-50m.json'))
const states = simplifiedTopology(readTopology('us-atlas/states-10m.json'))
const countries = feature(world, world.objects.countries as GeometryCollection<Named>)
const usStates = feature(states, states.objects.states as GeometryCollection<Named>)

const features = [
  ...countries.features.filter(f => f.properties?.name !== 'United States of America').map(f => ({ ...f, id: undefined, properties: { name: f.properties!.name, kind: 'country' } })),
  ...usStates.features.map(f => ({ ...f, id: undefined, properties: { name: f.properties!.name, kind: 'US state' } })),
].filter(f => f.geometry)

const out = resolve(root, 'public/basemap')
mkdirSync(out, { recursive: true })
const json = JSON.stringify({ type: 'FeatureCollection', features })
writeFileSync(resolve(out, 'context.json'), json)
console.log(`[basemap] ${features.length} areas, ${(json.length / 1024).toFixed(0)} kB → public/basemap/context.json`)
