// One's own account: profile, password change (other sessions end, this one goes on).
import { afterAll, describe, expect, it } from 'vitest'
import { Client, TEST_PASSWORD, createMember, createOrganisation } from '../support/accounts'
import { testPool } from '../support/db'
import { waitForMail } from '../support/mail'

const pool = testPool()
afterAll(() => pool.end())

describe('own account', () => {
  it('changes the password: checks the current one and the rules, ends the other sessions, keeps this one', async () => {
    const org = await createOrganisation(pool, 'Account Operator')
    const { email } = await createMember(pool, org, 'asset_manager')
    const here = new Client()
    const elsewhere = new Client()
    await here.signIn(email)
    await elsewhere.signIn(email)

    expect((await here.post('/api/auth/change-password', { currentPassword: 'not it at all', newPassword: 'a fine new passphrase' })).status).toBe(400)
    expect((await here.post('/api/auth/change-password', { currentPassword: TEST_PASSWORD, newPassword: 'short' })).status).toBe(400)
    const asEmail = await here.post('/api/auth/change-password', { currentPassword: TEST_PASSWORD, newPassword: email })
    expect(asEmail.status).toBe(400)
    expect((await asEmail.json()).statusMessage).toMatch(/e-mail/)

    const since = new Date()
    expect((await here.post('/api/auth/change-password', { currentPassword: TEST_PASSWORD, newPassword: 'a fine new passphrase' })).status).toBe(200)
    expect((await here.get('/api/_auth/session')).status).toBe(200)
    expect((await elsewhere.get('/api/_auth/session')).status).toBe(401)
    expect((await new Client().signIn(email, 'a fine new passphrase')).status).toBe(200)
    expect((await waitForMail(pool, email, since)).subject).toMatch(/password was changed/)
  })

  it('changes the name shown in the session', async () => {
    const org = await createOrganisation(pool, 'Profile Operator')
    const { email } = await createMember(pool, org, 'viewer')
    const client = new Client()
    await client.signIn(email)
    expect((await client.patch('/api/auth/profile', { name: '   ' })).status).toBe(400)
    expect((await client.patch('/api/auth/profile', { name: 'Vera Viewer' })).status).toBe(200)
    expect((await (await client.get('/api/_auth/session')).json()).user.name).toBe('Vera Viewer')
  })
})
