// The role × route matrix (contract in tests/server/matrix/types.ts): every file under server/api/
// has a rule; each rule's statuses hold for anonymous callers and for every role; every route that
// takes an id answers 404 — never data — to members of another organisation. The same statuses hold
// for an API token of each role (Authorization: Bearer, no session), except on the routes tokens
// never open (server/utils/auth.ts TOKEN_REFUSED_PATHS: 403 to every token); a revoked and an
// expired token answer 401 on every guarded route, a read-only token 403 on every guarded write.
import { randomUUID } from 'node:crypto'
import { readdirSync } from 'node:fs'
import { relative, resolve } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ALL_ROLES, bearerClient, Client, createMember, createOrganisation, insertApiToken, type RoleName } from '../support/accounts'
import { testPool } from '../support/db'
import type { MatrixModule, RouteRule } from './matrix/types'

const root = resolve(import.meta.dirname, '../..')
const pool = testPool()
afterAll(() => pool.end())

// Every module in matrix/ except the contract itself; a new domain adds its file and nothing else.
const modules = Object.entries(import.meta.glob<MatrixModule>(['./matrix/*.ts', '!./matrix/types.ts'], { eager: true }))
  .map(([file, mod]) => ({ file, rules: mod.rules, fixtures: mod.fixtures }))

interface Route { file: string, method: string, path: string }

/** server/api/members/[id].patch.ts → PATCH /api/members/[id]; index files name their folder. */
function discoverRoutes(): Route[] {
  const dir = resolve(root, 'server/api')
  return (readdirSync(dir, { recursive: true }) as string[])
    .filter(f => f.endsWith('.ts'))
    .map((f) => {
      const file = relative(root, resolve(dir, f)).split('\\').join('/')
      const m = /^server\/api\/(.*?)(?:\.(get|post|patch|put|delete))?\.ts$/.exec(file)!
      const route = m[1]!.replace(/(^|\/)index$/, '')
      return { file, method: (m[2] ?? 'ANY').toUpperCase(), path: `/api${route ? `/${route}` : ''}` }
    })
}

const routes = discoverRoutes()
const allRules = modules.flatMap(m => m.rules.map(rule => ({ rule, module: m })))

describe('every route file has a rule', () => {
  it('has a method suffix on every route file (GET/POST/PATCH/PUT/DELETE)', () => {
    expect(routes.filter(r => r.method === 'ANY').map(r => r.file)).toEqual([])
  })
  it('has exactly one rule per route file, with the method and path the file name gives', () => {
    const missing = routes.filter(r => !allRules.some(x => x.rule.file === r.file)).map(r => r.file)
    expect(missing, 'Add these routes to a module in tests/server/matrix/ with who may call them').toEqual([])
    const stale = allRules.filter(x => !routes.some(r => r.file === x.rule.file)).map(x => x.rule.file)
    expect(stale, 'These rules name files that do not exist').toEqual([])
    const counts = new Map<string, number>()
    for (const { rule } of allRules) counts.set(rule.file, (counts.get(rule.file) ?? 0) + 1)
    expect([...counts].filter(([, n]) => n > 1).map(([f]) => f), 'Routes with more than one rule').toEqual([])
    for (const { rule } of allRules) {
      const route = routes.find(r => r.file === rule.file)!
      expect(`${rule.method} ${rule.path}`, rule.file).toBe(`${route.method} ${route.path}`)
    }
  })
  it('gives every route that takes an organisation\'s row by id a cross-organisation probe', () => {
    // A [param] route needs `params` unless it is public (its token is the credential).
    const unprobed = allRules.filter(({ rule }) => /\[/.test(rule.path) && typeof rule.allowed !== 'string' && !rule.params).map(x => x.rule.file)
    expect(unprobed, 'Add `params` (fixture keys) to these rules').toEqual([])
  })
})

// People: the home organisation holds the fixtures; the other organisation's members probe them.
const home: Record<RoleName, Client> = {} as Record<RoleName, Client>
const other: Record<RoleName, Client> = {} as Record<RoleName, Client>
const homeEmails: Record<string, string> = {}
/** An API token of each home member, and three of the home admin: revoked, expired, read-only. */
const homeTokens: Record<RoleName, Client> = {} as Record<RoleName, Client>
const specialTokens: Record<'revoked' | 'expired' | 'readOnly', Client> = {} as Record<'revoked' | 'expired' | 'readOnly', Client>
const fixtures = new Map<string, Record<string, string>>()

async function signedIn(organisationId: string, role: RoleName): Promise<{ client: Client, email: string, userId: string }> {
  const { email, userId } = await createMember(pool, organisationId, role)
  const client = new Client()
  const res = await client.signIn(email)
  if (res.status !== 200) throw new Error(`sign-in failed for ${email}: ${res.status}`)
  return { client, email, userId }
}

/** Mirrors TOKEN_REFUSED_PATHS in server/utils/auth.ts: tokens never open these. */
function tokenRefused(path: string): boolean {
  return path.startsWith('/api/auth/') || path === '/api/tokens' || path.startsWith('/api/tokens/')
}

beforeAll(async () => {
  const homeOrg = await createOrganisation(pool, 'Matrix Home Operator')
  const otherOrg = await createOrganisation(pool, 'Matrix Other Insurer', 'insurer')
  for (const role of ALL_ROLES) {
    const h = await signedIn(homeOrg, role)
    home[role] = h.client
    homeEmails[role] = h.email
    homeTokens[role] = bearerClient((await insertApiToken(pool, h.userId, homeOrg, { name: `matrix ${role}` })).secret)
    if (role === 'admin') {
      specialTokens.revoked = bearerClient((await insertApiToken(pool, h.userId, homeOrg, { state: 'revoked' })).secret)
      specialTokens.expired = bearerClient((await insertApiToken(pool, h.userId, homeOrg, { state: 'expired' })).secret)
      specialTokens.readOnly = bearerClient((await insertApiToken(pool, h.userId, homeOrg, { readOnly: true })).secret)
    }
    other[role] = (await signedIn(otherOrg, role)).client
  }
  for (const m of modules) fixtures.set(m.file, m.fixtures ? await m.fixtures(pool, homeOrg) : {})
})

function pathWith(rule: RouteRule, values: (param: string) => string): string {
  return rule.path.replace(/\[(?:\.\.\.)?(\w+)\]/g, (_, name: string) => encodeURIComponent(values(name)))
}

async function call(client: Client, rule: RouteRule, path: string): Promise<Response> {
  return client.request(rule.method, path, rule.method === 'GET' ? undefined : (rule.body ?? {}))
}

/** A call may end its own session (sign-out); sign back in so later rules still have a session. */
async function keepSignedIn(role: RoleName) {
  if (!home[role].cookie) await home[role].signIn(homeEmails[role]!)
}

describe.each(allRules.map(x => [`${x.rule.method} ${x.rule.path}`, x] as const))('%s', (_name, { rule, module }) => {
  const title = rule.allowed === 'public'
    ? 'is open to everyone'
    : rule.allowed === 'token' ? 'answers 401 to every session without its bearer token' : `answers 401 without a session and 403 to roles other than ${rule.allowed.join(', ')}`
  it(title, async () => {
    const path = pathWith(rule, () => randomUUID())
    const anonymous = await call(new Client(), rule, path)
    const statuses: Record<string, number> = { anonymous: anonymous.status }
    for (const role of ALL_ROLES) {
      statuses[role] = (await call(home[role], rule, path)).status
      await keepSignedIn(role)
    }
    const expected: Record<string, string> = {}
    const actual: Record<string, string> = {}
    for (const [who, status] of Object.entries(statuses)) {
      const mayCall = rule.allowed === 'public' || (typeof rule.allowed !== 'string' && who !== 'anonymous' && rule.allowed.includes(who as RoleName))
      expected[who] = mayCall ? 'passes the guard' : who === 'anonymous' || rule.allowed === 'token' ? '401' : '403'
      actual[who] = status === 401 || status === 403 ? String(status) : 'passes the guard'
    }
    expect(actual, `statuses: ${JSON.stringify(statuses)}`).toEqual(expected)
  })

  const tokenTitle = rule.allowed === 'public'
    ? 'is open to API tokens too'
    : rule.allowed === 'token' ? 'answers 401 to API tokens' : tokenRefused(rule.path) ? 'answers 403 to every API token (sessions only)' : 'answers API tokens of each role as it answers their sessions; revoked and expired tokens 401'
  it(tokenTitle, async () => {
    const path = pathWith(rule, () => randomUUID())
    const callers: [string, Client][] = [...ALL_ROLES.map(role => [role, homeTokens[role]] as [string, Client]), ['revoked', specialTokens.revoked], ['expired', specialTokens.expired]]
    if (rule.method !== 'GET') callers.push(['readOnly', specialTokens.readOnly])
    const statuses: Record<string, number> = {}
    for (const [who, client] of callers) statuses[who] = (await call(client, rule, path)).status
    const expected: Record<string, string> = {}
    const actual: Record<string, string> = {}
    for (const [who, status] of Object.entries(statuses)) {
      let want: string
      if (rule.allowed === 'public') want = 'passes the guard'
      else if (rule.allowed === 'token') want = '401'
      else if (tokenRefused(rule.path)) want = '403'
      else if (who === 'revoked' || who === 'expired') want = '401'
      else if (who === 'readOnly') want = '403'
      else want = rule.allowed.includes(who as RoleName) ? 'passes the guard' : '403'
      expected[who] = want
      actual[who] = status === 401 || status === 403 ? String(status) : 'passes the guard'
    }
    expect(actual, `statuses: ${JSON.stringify(statuses)}`).toEqual(expected)
  })

  if (rule.params && typeof rule.allowed !== 'string') {
    const allowed = rule.allowed
    it(`answers 404 to ${allowed.join(', ')} of another organisation on this organisation's rows`, async () => {
      const values = fixtures.get(module.file)!
      const path = pathWith(rule, (param) => {
        const key = rule.params![param]
        if (!key || !values[key]) throw new Error(`fixture '${key}' for [${param}] is missing from ${module.file}`)
        return values[key]!
      })
      for (const role of allowed) {
        const res = await call(other[role], rule, path)
        const text = await res.text()
        expect(res.status, `${role} of another organisation: ${text.slice(0, 300)}`).toBe(404)
        // Never data: nothing of the row comes back (the error echoes the URL, which the caller sent).
        const body = JSON.parse(text) as Record<string, unknown>
        delete body.url
        const echoed = JSON.stringify(body)
        for (const value of Object.values(values)) expect(echoed).not.toContain(value)
      }
    })
  }
})
