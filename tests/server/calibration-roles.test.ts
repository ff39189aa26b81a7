// The calibration rules of the role × route matrix (tests/server/matrix/types.ts), checked on their own.
import { existsSync } from 'node:fs'
import { resolve } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ALL_ROLES, Client, createOrganisation, memberClient, type RoleName } from '../support/accounts'
import { testPool } from '../support/db'
import { fixtures, rules } from './matrix/calibration'

const pool = testPool()
afterAll(() => pool.end())

const clients = new Map<RoleName, Client>()
let ids: Record<string, string> = {}
let outsider: Client

beforeAll(async () => {
  const org = await createOrganisation(pool, 'Calibration Matrix Operator')
  for (const role of ALL_ROLES) clients.set(role, await memberClient(pool, org, role))
  ids = await fixtures(pool, org)
  outsider = await memberClient(pool, await createOrganisation(pool, 'Calibration Matrix Other'), 'admin')
})

const RANDOM = '00000000-0000-4000-8000-000000000000'
const withIds = (path: string, lookup: (key: string) => string) => path.replace(/\[(\w+)\]/g, (_, p: string) => lookup(p))

describe('calibration routes × roles', () => {
  it('names real route files', () => {
    for (const r of rules) expect(existsSync(resolve(import.meta.dirname, '../..', r.file)), r.file).toBe(true)
  })

  it.each(rules.map(r => [`${r.method} ${r.path}`, r] as const))('%s: anonymous 401, other roles 403, allowed roles pass the guard', async (_, rule) => {
    const path = withIds(rule.path, () => RANDOM)
    expect((await new Client().request(rule.method, path, rule.method === 'GET' ? undefined : {})).status).toBe(401)
    for (const role of ALL_ROLES) {
      const status = (await clients.get(role)!.request(rule.method, path, rule.method === 'GET' ? undefined : {})).status
      if (rule.allowed === 'public' || rule.allowed.includes(role)) expect([401, 403], `${role} ${status}`).not.toContain(status)
      else expect(status, role).toBe(403)
    }
  })

  it('answers 404 to another organisation for this organisation\'s records', async () => {
    for (const rule of rules.filter(r => r.params)) {
      const path = withIds(rule.path, p => ids[rule.params![p]!]!)
      expect((await outsider.request(rule.method, path, rule.method === 'POST' ? { assumptionVersionId: RANDOM, siteIds: [RANDOM] } : undefined)).status, rule.path).toBe(404)
    }
  })
})
