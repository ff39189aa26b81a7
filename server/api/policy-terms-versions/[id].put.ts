// PUT /api/policy-terms-versions/:id — replace the version's site rows (the whole table, as the
// editor sends it) and, when given, its layers on the portfolio. A version no run has recorded changes in place; a recorded one stays as it is
// and the rows become the set's next version.
import { eq } from 'drizzle-orm'
import { termsVersionSaveSchema } from '~~/shared/schemas/insurance'
import { useDb } from '~~/server/db'
import { policyTermsVersions } from '~~/server/db/schema'
import { addTermsVersion, findTermsVersion, layersOf, portfolioSiteIds, writeLayers, writeTermsRows } from '~~/server/insurance/terms-store'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.underwriting })
  const id = readId(event, 'Terms version')
  const body = await readValidBody(event, termsVersionSaveSchema)
  const row = await findTermsVersion(useDb(), member.organisationId, id)
  if (!row) notFound('Terms version')
  const siteIds = await portfolioSiteIds(useDb(), row.set.portfolioId)
  const strangers = body.sites.filter(s => !siteIds.has(s.siteId))
  if (strangers.length) badRequest(`${strangers.length} row(s) name sites that are not in the portfolio "${row.set.name}" covers. Reload the terms and try again.`)
  return useDb().transaction(async (tx) => {
    // Re-read under lock: a run may have recorded this version meanwhile.
    const [current] = await tx.select().from(policyTermsVersions).where(eq(policyTermsVersions.id, id)).for('update')
    const audit = { organisationId: member.organisationId, userId: member.user.id, entity: 'policy_terms_version' }
    const layersBefore = await layersOf(tx, id)
    const layers = body.layers ?? layersBefore
    if (current!.usedByRun) {
      const version = await addTermsVersion(tx, row.set.id, member.user.id, body.note || `Edited from version ${current!.version}`, body.sites, layers)
      await recordAudit({ ...audit, action: 'create', entityId: version.id, before: { version: current!.version, layers: layersBefore }, after: { version: version.version, sites: body.sites.length, layers } }, { tx, event })
      return { version, createdNewVersion: true }
    }
    await writeTermsRows(tx, id, body.sites)
    await writeLayers(tx, id, layers)
    const [version] = await tx.update(policyTermsVersions).set({ note: body.note || current!.note, updatedAt: new Date() }).where(eq(policyTermsVersions.id, id)).returning()
    await recordAudit({ ...audit, action: 'update', entityId: id, before: { version: current!.version, layers: layersBefore }, after: { version: current!.version, sites: body.sites.length, layers } }, { tx, event })
    return { version: version!, createdNewVersion: false }
  })
})
