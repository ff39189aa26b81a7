// POST /api/policy-terms — a terms set for a readable portfolio; version 1 starts with no site rows
// (sites without a row count in full until terms are entered).
import { termsSetCreateSchema } from '~~/shared/schemas/insurance'
import { useDb } from '~~/server/db'
import { policyTermsSets } from '~~/server/db/schema'
import { addTermsVersion } from '~~/server/insurance/terms-store'
import { findReadablePortfolio } from '~~/server/inventory/access'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.underwriting })
  const body = await readValidBody(event, termsSetCreateSchema)
  await findReadablePortfolio(member, body.portfolioId)
  return useDb().transaction(async (tx) => {
    const [set] = await tx.insert(policyTermsSets).values({
      organisationId: member.organisationId, portfolioId: body.portfolioId, name: body.name, description: body.description, createdBy: member.user.id,
    }).onConflictDoNothing().returning()
    if (!set) conflict('This portfolio has terms already. Open them and save a new version instead.')
    const version = await addTermsVersion(tx, set.id, member.user.id, 'First version', [])
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'create', entity: 'policy_terms', entityId: set.id, after: { name: set.name, portfolioId: set.portfolioId, version: 1 } }, { tx, event })
    return { set, version }
  })
})
