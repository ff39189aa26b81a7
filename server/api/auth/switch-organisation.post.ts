// POST /api/auth/switch-organisation — work in another organisation the person belongs to. Any
// member; an organisation they do not belong to answers 404.
import { eq } from 'drizzle-orm'
import { switchOrganisationSchema } from '~~/shared/schemas/auth'
import { useDb } from '~~/server/db'
import { users } from '~~/server/db/schema'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.everyone })
  const body = await readValidBody(event, switchOrganisationSchema)
  const target = (await membershipsOf(member.user.id)).find(m => m.organisationId === body.organisationId)
  if (!target) notFound('Organisation')
  const db = useDb()
  const [user] = await db.update(users).set({ lastOrganisationId: target.organisationId }).where(eq(users.id, member.user.id)).returning()
  await startMemberSession(event, user!, target, member.sessionId ?? undefined)
  return { ok: true, organisationId: target.organisationId, role: target.role }
})
