// POST /api/auth/reset-password/:token — set a new password with a reset link. Public (the token is
// the credential). Single use; every session of the person ends.
import { resetConfirmSchema, tokenParamsSchema } from '~~/shared/schemas/auth'
import { confirmPasswordReset } from '~~/server/accounts/password-reset'

export default defineEventHandler(async (event) => {
  const { token } = readValidParams(event, tokenParamsSchema)
  const body = await readValidBody(event, resetConfirmSchema)
  await confirmPasswordReset(event, token, body.password)
  await clearUserSession(event)
  return { ok: true }
})
