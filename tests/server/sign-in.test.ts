import { afterAll, describe, expect, it } from 'vitest'
import { Client, createMember, createOrganisation } from '../support/accounts'
import { testPool } from '../support/db'

const pool = testPool()
afterAll(() => pool.end())

describe('POST /api/auth/sign-in', () => {
  it('starts a session with the right password and refuses a wrong one with the same message as an unknown e-mail', async () => {
    const org = await createOrganisation(pool, 'Sign-in Test Operator')
    const { email } = await createMember(pool, org, 'analyst')
    const good = new Client()
    const res = await good.signIn(email)
    expect(res.status).toBe(200)
    expect((await res.json()).role).toBe('analyst')
    expect(good.cookie).toMatch(/^nuxt-session=/)

    const wrong = await new Client().signIn(email, 'not the password at all')
    const unknown = await new Client().signIn('nobody@example.test', 'not the password at all')
    expect(wrong.status).toBe(401)
    expect(unknown.status).toBe(401)
    // No account enumeration: both answers say the same (common practice, OWASP authentication guidance).
    expect((await wrong.json()).statusMessage).toBe((await unknown.json()).statusMessage)
  })
})
