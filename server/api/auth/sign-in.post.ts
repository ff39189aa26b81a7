// POST /api/auth/sign-in — e-mail and password; starts a session in the organisation the person
// worked in last (or the first they joined). Public. Throttled per e-mail and per client address;
// an unknown e-mail and a wrong password get the same answer.
import { eq } from 'drizzle-orm'
import { signInSchema } from '~~/shared/schemas/auth'
import { useDb } from '~~/server/db'
import { users } from '~~/server/db/schema'
import { assertSignInAllowed, recordSignInAttempt } from '~~/server/accounts/sign-in-throttle'
import { checkPassword } from '~~/server/accounts/passwords'

const WRONG = 'That e-mail and password do not match an account.'

export default defineEventHandler(async (event) => {
  const body = await readValidBody(event, signInSchema)
  const address = clientAddress(event)
  await assertSignInAllowed(event, body.email, address)

  const db = useDb()
  const [user] = await db.select().from(users).where(eq(users.email, body.email))
  const passwordMatches = await checkPassword(user?.passwordHash ?? null, body.password)
  if (!user || user.disabled || !passwordMatches) {
    await recordSignInAttempt(body.email, address, false)
    await recordAudit({ organisationId: null, userId: user?.id ?? null, action: 'sign_in_failed', entity: 'account', entityId: user?.id ?? null, after: { email: body.email } }, { event })
    throw createError({ statusCode: 401, statusMessage: WRONG })
  }

  const memberships = await membershipsOf(user.id)
  const membership = memberships.find(m => m.organisationId === user.lastOrganisationId) ?? memberships[0]
  if (!membership) throw createError({ statusCode: 403, statusMessage: 'Your account is not a member of any organisation. Ask an administrator to invite you.' })

  await recordSignInAttempt(body.email, address, true)
  await startMemberSession(event, user, membership)
  await db.update(users).set({ lastSignInAt: new Date(), lastOrganisationId: membership.organisationId }).where(eq(users.id, user.id))
  await recordAudit({ organisationId: membership.organisationId, userId: user.id, action: 'sign_in', entity: 'account', entityId: user.id }, { event })
  return { ok: true, organisationId: membership.organisationId, role: membership.role }
})
