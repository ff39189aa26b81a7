// The upload threads (server/inventory/parse-pool.ts) start with the web server and stop with it.
import { closeParsePool, warmParsePool } from '../inventory/parse-pool'

export default defineNitroPlugin((nitroApp) => {
  if (import.meta.prerender) return
  warmParsePool()
  nitroApp.hooks.hook('close', closeParsePool)
})
