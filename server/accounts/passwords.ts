// Password checks inside Nitro (hashPassword / verifyPassword come from nuxt-auth-utils).
import { passwordProblem } from '../../shared/schemas/auth'
import { fieldProblem } from '../utils/errors'

let dummyHash: Promise<string> | undefined

/**
 * Verifies a password; with no stored hash (unknown e-mail, account without a password) it still
 * spends the time of one verification, so response times do not tell whether an account exists.
 */
export async function checkPassword(storedHash: string | null, plain: string): Promise<boolean> {
  if (storedHash) return verifyPassword(storedHash, plain)
  dummyHash ??= hashPassword('not-a-real-password-just-for-timing')
  await verifyPassword(await dummyHash, plain)
  return false
}

/** Throws 400 with a message by the field when a new password breaks the rules. */
export function assertPasswordAllowed(password: string, email: string, field = 'password'): void {
  const problem = passwordProblem(password, email)
  if (problem) fieldProblem(field, problem)
}
