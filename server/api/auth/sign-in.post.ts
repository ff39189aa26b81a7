// POST /api/auth/sign-in — e-mail and password; starts a session in the person's first organisation.
import { asc, eq } from 'drizzle-orm'
import { signInSchema } from '~~/shared/schemas/auth'
import { useDb } from '~~/server/db'
import { memberships, users } from '~~/server/db/schema'

const WRONG = 'That e-mail and password do not match an account.'

export default defineEventHandler(async (event) => {
  const body = await readValidatedBody(event, signInSchema.parse)
  const db = useDb()
  const [user] = await db.select().from(users).where(eq(users.email, body.email))
  if (!user?.passwordHash || user.disabled || !(await verifyPassword(user.passwordHash, body.password))) {
    throw createError({ statusCode: 401, statusMessage: WRONG })
  }
  const [membership] = await db.select().from(memberships).where(eq(memberships.userId, user.id)).orderBy(asc(memberships.createdAt)).limit(1)
  if (!membership) throw createError({ statusCode: 403, statusMessage: 'Your account is not a member of any organisation.' })
  await replaceUserSession(event, {
    user: { id: user.id, email: user.email, name: user.name },
    organisationId: membership.organisationId,
    role: membership.role,
    sessionVersion: user.sessionVersion,
    loggedInAt: Date.now(),
  })
  await db.update(users).set({ lastSignInAt: new Date() }).where(eq(users.id, user.id))
  return { ok: true, organisationId: membership.organisationId, role: membership.role }
})
