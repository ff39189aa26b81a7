// GET /api/auth/reset-password/:token — whether a reset link can still be used. Public (the token is
// the credential): 404 unknown, 410 used or expired.
import { tokenParamsSchema } from '~~/shared/schemas/auth'
import { usableResetToken } from '~~/server/accounts/password-reset'

export default defineEventHandler(async (event) => {
  const { token } = readValidParams(event, tokenParamsSchema)
  const row = await usableResetToken(token)
  return { ok: true, expiresAt: row.expiresAt.toISOString() }
})
