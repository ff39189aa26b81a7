// The basemap ships with the app: Natural Earth countries at 1:50m from the world-atlas package,
// TopoJSON converted to GeoJSON with topojson-client in the browser and registered with ECharts.
// Both are loaded by dynamic import, so they sit in a chunk of their own, fetched from this server
// only when a map is first drawn (never in the main client chunk, never from the internet).
import type { GeometryCollection, Topology } from 'topojson-specification'

export const BASEMAP_NAME = 'stormledger-countries'

type CountriesTopology = Topology<{ countries: GeometryCollection<{ name: string }> }>

let registration: Promise<void> | null = null

/** Registers the basemap with ECharts once; later calls share the same promise. */
export function loadBasemap(): Promise<void> {
  registration ??= (async () => {
    const [{ feature }, atlas, { registerMap }] = await Promise.all([
      import('topojson-client'),
      import('world-atlas/countries-50m.json'),
      import('echarts/core'),
    ])
    const topology = (('default' in atlas ? atlas.default : atlas) as unknown) as CountriesTopology
    if (topology?.type !== 'Topology' || !topology.objects?.countries) throw new Error('the basemap file is not a TopoJSON topology with countries')
    const countries = feature(topology, topology.objects.countries)
    registerMap(BASEMAP_NAME, countries as unknown as Parameters<typeof registerMap>[1])
  })()
  registration.catch(() => { registration = null })
  return registration
}

/** Loads the basemap after mount; `ready` turns true once it is registered, `error` holds a readable failure. */
export function useBasemap() {
  const ready = ref(false)
  const error = ref<string | null>(null)
  onMounted(() => {
    loadBasemap()
      .then(() => { ready.value = true })
      .catch((e: unknown) => { error.value = `the basemap could not be loaded (${e instanceof Error ? e.message : String(e)})` })
  })
  return { ready, error }
}
