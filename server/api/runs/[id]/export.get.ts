// GET /api/runs/:id/export — the results workbook of a succeeded run (everyone but viewers); audited.
import { eq } from 'drizzle-orm'
import { useDb } from '~~/server/db'
import { users } from '~~/server/db/schema'
import { findVersion } from '~~/server/assumptions/versions'
import { findSucceededRun, portfolioResult, siteResults, tankResults } from '~~/server/results/queries'
import { writeResultsWorkbook } from '~~/server/results/workbook'
import { settings } from '~~/server/settings'
import { sendWorkbook } from '~~/server/utils/sheets'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.exporters })
  const id = readId(event, 'Results of this run')
  const run = await findSucceededRun(member.organisationId, id)
  if (!run) notFound('Results of this run')
  const db = useDb()
  const [portfolio, sites, tanks, version, requester] = await Promise.all([
    portfolioResult(run.id), siteResults(run.id),
    tankResults(run.id),
    findVersion(member.organisationId, run.assumptionVersionId),
    run.requestedBy ? db.select({ name: users.name }).from(users).where(eq(users.id, run.requestedBy)) : Promise.resolve([]),
  ])
  if (!portfolio || !version) notFound('Results of this run')
  const buffer = await writeResultsWorkbook({
    run, portfolio, sites, tanks, currency: member.currency, publicUrl: settings.publicUrl,
    assumptions: { setName: version.set.name, version: version.version.version, parameters: version.version.parameters },
    requestedBy: requester[0]?.name ?? null, exportedBy: member.user.name,
  })
  await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'export', entity: 'run', entityId: run.id, after: { workbook: 'results' } }, { event })
  return sendWorkbook(event, buffer, `stormledger-results-${run.id.slice(0, 8)}.xlsx`)
})
