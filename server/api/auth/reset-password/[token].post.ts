// POST /api/auth/reset-password/:token — set a new password with a reset link. Public (the token is
// the credential). Single use; every session of the person ends.
import { resetConfirmSchema, tokenParamsSchema } from '~~/shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const { token } = await getValidatedRouterParams(event, tokenParamsSchema.parse)
  const body = await readValidatedBody(event, resetConfirmSchema.parse)
  await confirmPasswordReset(event, token, body.password)
  await clearUserSession(event)
  return { ok: true }
})
