// The session secret: NUXT_SESSION_PASSWORD if set, otherwise one generated once into .data/.
import { randomBytes } from 'node:crypto'
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { resolve } from 'node:path'

export function sessionSecret(root: string): string {
  const fromEnv = process.env.NUXT_SESSION_PASSWORD
  if (fromEnv) {
    if (fromEnv.length < 32) throw new Error('NUXT_SESSION_PASSWORD must be at least 32 characters')
    return fromEnv
  }
  const file = resolve(root, '.data/session-secret')
  if (!existsSync(file)) {
    mkdirSync(resolve(root, '.data'), { recursive: true })
    writeFileSync(file, randomBytes(32).toString('hex'), { mode: 0o600 })
  }
  return readFileSync(file, 'utf8').trim()
}
