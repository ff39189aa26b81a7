// Password reset: single-use tokens valid for one hour. A request is queued and answered at once,
// whether or not the address has an account; a confirmed reset ends every session.
import { and, eq, isNull, sql } from 'drizzle-orm'
import { createError, type H3Event } from 'h3'
import { useDb } from '../db'
import { passwordResetTokens, users } from '../db/schema'
import { enqueue } from '../jobs/queue'
import { passwordChangedMail } from '../mail/templates'
import { recordAudit } from '../utils/audit'
import { appLink, queueMail } from '../utils/mail'
import { clientAddress } from '../utils/client-address'
import { revokeUserSessions } from './sessions'
import { hashToken } from './tokens'
import { assertPasswordAllowed } from './passwords'

/**
 * Queues the request and returns: the lookup, the token and the mail happen in the
 * 'auth.password-reset' job (server/accounts/password-reset-request.ts), so a known and an unknown
 * address take the same path and the same time here.
 */
export async function requestPasswordReset(event: H3Event, email: string): Promise<void> {
  await enqueue('auth.password-reset', { email, ipAddress: clientAddress(event) })
}

type ResetToken = typeof passwordResetTokens.$inferSelect

/** The token's row, or throws 404 (unknown) / 410 (used or expired) with a message saying what to do. */
export async function usableResetToken(token: string, executor: Pick<ReturnType<typeof useDb>, 'select'> = useDb(), lock = false): Promise<ResetToken> {
  const query = executor.select().from(passwordResetTokens).where(eq(passwordResetTokens.tokenHash, hashToken(token)))
  const [row] = lock ? await query.for('update') : await query
  if (!row) throw createError({ statusCode: 404, statusMessage: 'This reset link is not valid. Ask for a new one.' })
  if (row.usedAt || row.expiresAt.getTime() <= Date.now()) {
    throw createError({ statusCode: 410, statusMessage: 'This reset link has expired or was already used. Ask for a new one.' })
  }
  return row
}

/** Sets the new password, uses up the token (and every other open token of the person), ends every session. */
export async function confirmPasswordReset(event: H3Event, token: string, password: string): Promise<void> {
  const db = useDb()
  const email = await db.transaction(async (tx) => {
    const row = await usableResetToken(token, tx, true)
    const [user] = await tx.select().from(users).where(eq(users.id, row.userId))
    if (!user || user.disabled) throw createError({ statusCode: 410, statusMessage: 'This reset link has expired or was already used. Ask for a new one.' })
    assertPasswordAllowed(password, user.email)
    const passwordHash = await hashPassword(password)
    await tx.update(users).set({ passwordHash, sessionVersion: sql`${users.sessionVersion} + 1` }).where(eq(users.id, user.id))
    await revokeUserSessions(user.id, { executor: tx })
    await tx.update(passwordResetTokens).set({ usedAt: new Date() }).where(and(eq(passwordResetTokens.userId, user.id), isNull(passwordResetTokens.usedAt)))
    await recordAudit({ organisationId: null, userId: user.id, action: 'password_reset', entity: 'account', entityId: user.id }, { tx, event })
    return user.email
  })
  await queueMail(email, passwordChangedMail({ signInLink: appLink('/sign-in'), resetLink: appLink('/reset-password') }), 'personal')
}
