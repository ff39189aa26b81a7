// Password hashing for scripts and seeders that run outside Nitro. It produces the same scrypt format
// as nuxt-auth-utils' hashPassword / verifyPassword (both use @adonisjs/hash with default options),
// so either side can verify what the other wrote.
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'

const hash = new Hash(new Scrypt({}))

export const hashPasswordOutsideNitro = (password: string) => hash.make(password)
export const verifyPasswordOutsideNitro = (hashed: string, plain: string) => hash.verify(hashed, plain)
