// PATCH /api/auth/profile — change one's own name. Any member.
import { eq } from 'drizzle-orm'
import { profileSchema } from '~~/shared/schemas/auth'
import { useDb } from '~~/server/db'
import { users } from '~~/server/db/schema'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.everyone })
  const body = await readValidBody(event, profileSchema)
  await useDb().transaction(async (tx) => {
    await tx.update(users).set({ name: body.name }).where(eq(users.id, member.user.id))
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'update', entity: 'user', entityId: member.user.id, before: { name: member.user.name }, after: { name: body.name } }, { tx, event })
  })
  const session = await getUserSession(event)
  await setUserSession(event, { user: { ...session.user!, name: body.name } })
  return { ok: true, name: body.name }
})
