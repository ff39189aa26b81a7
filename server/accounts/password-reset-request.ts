// The work behind "Forgot your password?", done by a worker after the request has been answered:
// look the address up, and for a real, enabled account under the hourly cap store a one-hour token
// and mail the link. Unknown addresses end here silently. Runs outside Nitro, so imports are explicit.
import { and, count, eq, gt } from 'drizzle-orm'
import { useDb } from '../db'
import { passwordResetTokens, users } from '../db/schema'
import { passwordResetMail } from '../mail/templates'
import { recordAudit } from '../utils/audit'
import { appLink, queueMail } from '../utils/mail'
import { newToken, RESET_LIFETIME_MS } from './tokens'

/** At most this many reset messages per account per hour, so the form cannot be used to flood an inbox. */
export const MAX_RESET_MAILS_PER_HOUR = 5

/** Returns whether a link was mailed (for logs and tests; the requester is never told). */
export async function workPasswordResetRequest(email: string, ipAddress: string | null): Promise<boolean> {
  const db = useDb()
  const [user] = await db.select().from(users).where(eq(users.email, email))
  if (!user || user.disabled) return false
  const [recent] = await db.select({ n: count() }).from(passwordResetTokens)
    .where(and(eq(passwordResetTokens.userId, user.id), gt(passwordResetTokens.createdAt, new Date(Date.now() - 60 * 60 * 1000))))
  if ((recent?.n ?? 0) >= MAX_RESET_MAILS_PER_HOUR) return false
  const { token, tokenHash } = newToken()
  await db.transaction(async (tx) => {
    await tx.insert(passwordResetTokens).values({ userId: user.id, tokenHash, expiresAt: new Date(Date.now() + RESET_LIFETIME_MS) })
    await recordAudit({ organisationId: null, userId: user.id, action: 'password_reset_request', entity: 'account', entityId: user.id }, { tx, ipAddress })
  })
  await queueMail(user.email, passwordResetMail({ link: appLink(`/reset-password/${token}`) }), 'personal')
  return true
}
