// Single-use secrets sent by e-mail (invitations, password resets). The database keeps only their
// SHA-256, so reading the database does not give anyone a usable link.
import { createHash, randomBytes } from 'node:crypto'

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex')
}

/** 32 random bytes, URL-safe: 256 bits, beyond guessing. */
export function newToken(): { token: string, tokenHash: string } {
  const token = randomBytes(32).toString('base64url')
  return { token, tokenHash: hashToken(token) }
}

export const INVITATION_LIFETIME_MS = 7 * 24 * 60 * 60 * 1000
export const RESET_LIFETIME_MS = 60 * 60 * 1000
