// POST /api/auth/reset-password — ask for a reset link by e-mail. Public. The answer is the same
// whether or not the address has an account.
import { resetRequestSchema } from '~~/shared/schemas/auth'
import { requestPasswordReset } from '~~/server/accounts/password-reset'

export default defineEventHandler(async (event) => {
  const body = await readValidBody(event, resetRequestSchema)
  await requestPasswordReset(event, body.email)
  return { ok: true, message: 'If an account uses that address, a message with a reset link is on its way. The link works for one hour.' }
})
