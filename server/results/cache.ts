// Results of a succeeded run never change, so the payloads the result views read are kept in memory
// (a few recent runs per server process) instead of being rebuilt for every viewer.
const MAX_ENTRIES = 24
const entries = new Map<string, Promise<unknown>>()

export function cachedResult<T>(key: string, build: () => Promise<T>): Promise<T> {
  const hit = entries.get(key)
  if (hit) {
    // Refresh its place: the map's order is the eviction order.
    entries.delete(key)
    entries.set(key, hit)
    return hit as Promise<T>
  }
  const pending = build().catch((error) => {
    entries.delete(key)
    throw error
  })
  entries.set(key, pending)
  while (entries.size > MAX_ENTRIES) entries.delete(entries.keys().next().value!)
  return pending
}

/**
 * The same, kept as the serialised JSON body: under many concurrent viewers of a large run (the
 * site list of thousands of sites) serialising the payload again for every request is most of a
 * request's time. The route sets `content-type: application/json` and returns this as it is. The
 * promise is typed as the payload it serialises, which is what the client receives and parses, so
 * the route's typed `$fetch` / `useFetch` results stay those of the payload.
 */
export function cachedJson<T>(key: string, build: () => Promise<T>): Promise<T> {
  return cachedResult(`json:${key}`, async () => JSON.stringify(await build())) as Promise<unknown> as Promise<T>
}
