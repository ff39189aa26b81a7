// GET /api/health — version, database reachable, latest migration applied, queue reachable. Public.
import journal from '~~/drizzle/meta/_journal.json'
import pkg from '~~/package.json'
import { usePool } from '~~/server/db'
import { checkHealth } from '~~/server/db/health'

export default defineEventHandler(async (event) => {
  const report = await checkHealth(usePool(), pkg.version, journal.entries.map(e => e.tag))
  if (report.status !== 'ok') setResponseStatus(event, 503)
  return report
})
