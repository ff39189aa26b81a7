// POST /api/auth/change-password — current and new password. Any member. Every other session of the
// person ends; this one carries on. Wrong current passwords count towards sign-in throttling.
import { eq, sql } from 'drizzle-orm'
import { changePasswordSchema } from '~~/shared/schemas/auth'
import { useDb } from '~~/server/db'
import { users } from '~~/server/db/schema'
import { passwordChangedMail } from '~~/server/mail/templates'
import { revokeUserSessions } from '~~/server/accounts/sessions'
import { assertSignInAllowed, recordSignInAttempt } from '~~/server/accounts/sign-in-throttle'
import { assertPasswordAllowed, checkPassword } from '~~/server/accounts/passwords'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.everyone })
  const body = await readValidBody(event, changePasswordSchema)
  const address = clientAddress(event)
  await assertSignInAllowed(event, member.user.email, address)
  const db = useDb()
  const [user] = await db.select().from(users).where(eq(users.id, member.user.id))
  if (!(await checkPassword(user?.passwordHash ?? null, body.currentPassword))) {
    await recordSignInAttempt(member.user.email, address, false)
    fieldProblem('currentPassword', 'The current password is not right.')
  }
  assertPasswordAllowed(body.newPassword, member.user.email, 'newPassword')
  const passwordHash = await hashPassword(body.newPassword)
  const updated = await db.transaction(async (tx) => {
    const [row] = await tx.update(users).set({ passwordHash, sessionVersion: sql`${users.sessionVersion} + 1` }).where(eq(users.id, member.user.id)).returning()
    await revokeUserSessions(member.user.id, { keepId: member.sessionId ?? undefined, executor: tx })
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'password_change', entity: 'account', entityId: member.user.id }, { tx, event })
    return row!
  })
  await startMemberSession(event, updated, { organisationId: member.organisationId, role: member.role }, member.sessionId ?? undefined)
  await queueMail(updated.email, passwordChangedMail({ signInLink: appLink('/sign-in'), resetLink: appLink('/reset-password') }), 'personal')
  return { ok: true }
})
