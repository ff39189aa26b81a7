// POST /api/sites/:id/notes — an underwriter's (or admin's) referral note on a site, with author and time.
import { siteNoteSchema } from '~~/shared/schemas/notes'
import { useDb } from '~~/server/db'
import { siteNotes } from '~~/server/db/schema'
import { findReadableSite } from '~~/server/inventory/access'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.underwriting })
  const { site } = await findReadableSite(member, readId(event, 'Site'))
  const { body } = await readValidBody(event, siteNoteSchema)
  return useDb().transaction(async (tx) => {
    const [note] = await tx.insert(siteNotes).values({ organisationId: member.organisationId, siteId: site.id, authorId: member.user.id, body }).returning()
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'create', entity: 'site_note', entityId: note!.id, after: { siteId: site.id, body } }, { tx, event })
    setResponseStatus(event, 201)
    return { ...note!, author: member.user.name }
  })
})
