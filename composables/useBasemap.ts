// The basemap ships with the app: public/basemap/context.json, a small GeoJSON written by
// scripts/make-basemap.ts from Natural Earth 1:50m countries and coastlines and the U.S. Census
// Bureau's state boundaries (both public domain; sources in public/basemap/SOURCES.md). It is
// fetched from this server only when a map is first drawn (never in the main client chunk, never
// from the internet) and registered with ECharts.

export const BASEMAP_NAME = 'stormledger-context'
export const BASEMAP_URL = '/basemap/context.json'

interface Collection { type: 'FeatureCollection', features: { properties?: { name?: string } }[] }

let registration: Promise<void> | null = null

/** Registers the basemap with ECharts once; later calls share the same promise. */
export function loadBasemap(): Promise<void> {
  registration ??= (async () => {
    const [response, { registerMap }] = await Promise.all([fetch(BASEMAP_URL), import('echarts/core')])
    if (!response.ok) throw new Error(`the server answered ${response.status}`)
    const geo = await response.json() as Collection
    if (geo?.type !== 'FeatureCollection' || !Array.isArray(geo.features)) throw new Error('the basemap file is not a GeoJSON feature collection')
    registerMap(BASEMAP_NAME, geo as unknown as Parameters<typeof registerMap>[1])
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
