// No 500s on bad input, and messages in words (issue 13, points 7 and 10): a NUL byte in text, an
// impossible date, money beyond its column, a body that is not JSON; then a property-based probe
// (fast-check, fixed seed) of every route that reads a body or a query, with generated malformed
// input, on this organisation's own rows so the input reaches validation and the queries.
import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import fc from 'fast-check'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createOrganisation, memberClient, type Client, type RoleName } from '../support/accounts'
import { root } from '../support/app-process'
import { testPool } from '../support/db'
import type { MatrixModule, RouteRule } from './matrix/types'

const pool = testPool()
let org: string
const clients = {} as Record<RoleName, Client>
let siteId: string

beforeAll(async () => {
  org = await createOrganisation(pool, 'Bad Input Operator')
  for (const role of ['admin', 'analyst', 'underwriter', 'asset_manager', 'viewer'] as const) clients[role] = await memberClient(pool, org, role)
  const res = await clients.analyst.post('/api/sites', { externalId: 'BI-1', name: 'Bad Input Flats', operatorName: 'Invented Operator', latitudeDeg: 31.9, longitudeDeg: -102.1, flashDensityPerKm2Yr: 4 })
  expect(res.status, await res.clone().text()).toBe(201)
  siteId = (await res.json()).id
})
afterAll(async () => {
  // The probe sends many failed sign-ins from 127.0.0.1; later files must not inherit the throttle.
  await pool.query('DELETE FROM sign_in_attempts')
  await pool.end()
})

async function answer(res: Response) {
  const text = await res.text()
  return { status: res.status, text, json: (() => { try { return JSON.parse(text) as { statusMessage?: string, data?: { fields?: Record<string, string> } } } catch { return {} } })() }
}

const tank = (values: Record<string, unknown> = {}) => ({
  externalId: `T-${Math.random().toString(36).slice(2, 8)}`, tag: 'TK-1', material: 'frp', heightM: 6, diameterM: 4, xM: 0, yM: 0, contents: 'crude', flammableVapourSpace: true, components: [], ...values,
})

describe('bad input answers 400 in words, never 500', () => {
  it('a NUL byte in a text query: 400 naming it', async () => {
    const a = await answer(await clients.viewer.get('/api/sites?q=%00'))
    expect(a.status, a.text).toBe(400)
    expect(a.json.statusMessage).toMatch(/NUL character/)
  })

  it('a NUL byte in a text field of a body: 400 with the field', async () => {
    const a = await answer(await clients.underwriter.post(`/api/sites/${siteId}/notes`, { body: 'before\u0000after' }))
    expect(a.status, a.text).toBe(400)
    expect(a.json.data?.fields).toHaveProperty('body')
  })

  it('an impossible date (month 13, day 45): 400 asking for a real date', async () => {
    const a = await answer(await clients.admin.get('/api/audit?from=2026-13-45'))
    expect(a.status, a.text).toBe(400)
    expect(a.json.statusMessage).toMatch(/real calendar date/)
    // 29 February exists in leap years only (Gregorian calendar): 2024 yes, 2026 no.
    expect((await clients.admin.get('/api/audit?from=2024-02-29')).status).toBe(200)
    expect((await clients.admin.get('/api/audit?to=2026-02-29')).status).toBe(400)
  })

  it('money beyond what its numeric(14,2) column holds is refused by validation; the largest amount is stored', async () => {
    // numeric(14, 2) holds up to 10^12 − 0.01 = 999,999,999,999.99 (PostgreSQL documentation, "Numeric Types"; hand-worked).
    const over = await answer(await clients.analyst.post(`/api/sites/${siteId}/tanks`, tank({ replacementValue: 1e12 })))
    expect(over.status, over.text).toBe(400)
    expect(over.json.data?.fields?.replacementValue).toMatch(/999,999,999,999\.99/)
    // 999,999,999,999.996 rounds to 10^12 cents-wise, which the column cannot hold either (hand-worked).
    expect((await clients.analyst.post(`/api/sites/${siteId}/tanks`, tank({ contentsValue: 999_999_999_999.996 }))).status).toBe(400)
    const most = await clients.analyst.post(`/api/sites/${siteId}/tanks`, tank({ replacementValue: 999_999_999_999.99 }))
    expect(most.status, await most.clone().text()).toBe(201)
  })

  it('a body that is not JSON: "the request body is not valid JSON", not a field message', async () => {
    const res = await clients.analyst.request('POST', '/api/portfolios', undefined, { 'content-type': 'application/json' })
    expect(res.status).toBe(400)
    const bad = await answer(await fetch(`${clients.analyst.baseUrl}/api/portfolios`, { method: 'POST', headers: { cookie: clients.analyst.cookie, 'content-type': 'application/json' }, body: '{"name": "Half' }))
    expect(bad.status).toBe(400)
    expect(bad.json.statusMessage).toBe('The request body is not valid JSON.')
  })

  it('validation messages are sentences, with every field in data.fields, never a dump of the issues', async () => {
    const a = await answer(await clients.analyst.post('/api/runs', { mode: 'sideways', seed: 'x' }))
    expect(a.status).toBe(400)
    expect(a.json.statusMessage).not.toMatch(/[[{]|"code"|Validation Error/)
    expect(a.json.statusMessage).toMatch(/^[A-Z].*\.$/)
    expect(Object.keys(a.json.data?.fields ?? {})).toEqual(expect.arrayContaining(['portfolioId', 'mode']))
    for (const message of Object.values(a.json.data!.fields!)) expect(message).not.toMatch(/"code"|expected .* received/)
  })
})

// ---------------------------------------------------------------- property-based probe

const modules = Object.entries(import.meta.glob<MatrixModule>(['./matrix/*.ts', '!./matrix/types.ts'], { eager: true }))
  .map(([file, mod]) => ({ file, rules: mod.rules, fixtures: mod.fixtures }))

/** The route reads a body or a query (our readers, h3's, or the raw request stream). */
const READS_INPUT = /readValidBody|readValidQuery|readMultipartFormData|readJsonBody|readRawBody|readBody|getQuery|event\.node\.req/
// Sign-out and organisation switching end or move this client's session; they read no input worth probing.
const SKIPPED = new Set(['server/api/auth/sign-out.post.ts', 'server/api/auth/switch-organisation.post.ts'])

const probed = modules.flatMap(m => m.rules.map(rule => ({ rule, module: m })))
  .filter(({ rule }) => !SKIPPED.has(rule.file) && READS_INPUT.test(readFileSync(resolve(root, rule.file), 'utf8')))

const nasty = fc.oneof(
  fc.string({ maxLength: 40 }),
  fc.string({ unit: 'binary', maxLength: 20 }),
  fc.string({ maxLength: 10 }).map(s => `${s}\u0000${s}`),
  fc.constantFrom('2026-13-45', '0000-00-00', '9999-99-99T99:99:99Z', '-1', '1e309', '9'.repeat(400), 'NaN', 'null', 'true', '%', '\'; --', '../', '00000000-0000-0000-0000-000000000000', 'x'.repeat(5000)),
)
const nastyValue: fc.Arbitrary<unknown> = fc.oneof(
  nasty,
  fc.double(),
  fc.constantFrom(1e308, -1e308, 1e15, 1e12, 1e14 - 0.01, 2 ** 53 + 2, -0, 0),
  fc.integer(),
  fc.boolean(),
  fc.constant(null),
  fc.array(nasty, { maxLength: 3 }),
  fc.dictionary(nasty, nasty, { maxKeys: 3 }),
)
const KEYS = ['q', 'name', 'title', 'description', 'email', 'password', 'role', 'from', 'to', 'page', 'person', 'entity', 'mode', 'metric', 'seed', 'years',
  'portfolioId', 'assumptionVersionId', 'siteId', 'siteIds', 'fileId', 'runId', 'runIds', 'externalId', 'latDeg', 'lonDeg', 'flashDensity', 'replacementValue',
  'parameters', 'rows', 'budget', 'body', 'kind', 'sort', 'limit', 'offset', 'format', 'token', 'currentPassword', 'newPassword', 'organisationId', 'series', 'source']
const key = fc.oneof(fc.constantFrom(...KEYS), nasty)

const queryArb = fc.dictionary(key, fc.oneof(nasty, fc.array(nasty, { minLength: 2, maxLength: 2 })), { maxKeys: 4 })
  .map(q => new URLSearchParams(Object.entries(q).flatMap(([k, v]) => (Array.isArray(v) ? v.map(x => [k, x]) : [[k, v]]))).toString())
const bodyArb = (rule: RouteRule) => fc.oneof(
  // Near-valid: the rule's own body (enough to reach the lookup) with fields replaced or added.
  fc.dictionary(key, nastyValue, { maxKeys: 5 }).map(extra => JSON.stringify({ ...(rule.body ?? {}), ...extra })),
  fc.jsonValue({ maxDepth: 3 }).map(v => JSON.stringify(v)),
  fc.constantFrom('{', '{"a":', '[1,2', 'nul', '\u0000', '{\'a\':1}', '{"a":1}}', ''),
)

function pathFor(rule: RouteRule, values: Record<string, string>): string {
  return rule.path.replace(/\[(?:\.\.\.)?(\w+)\]/g, (_, name: string) => encodeURIComponent(values[rule.params?.[name] ?? ''] ?? crypto.randomUUID()))
}

describe('generated malformed input to every route that reads a body or a query: never a 5xx', () => {
  const fixtureIds = new Map<string, Record<string, string>>()
  beforeAll(async () => {
    for (const m of modules) fixtureIds.set(m.file, m.fixtures ? await m.fixtures(pool, org) : {})
  })

  it('covers the routes that take input', () => {
    // Bodies: sites, tanks, runs, terms, capital, accounts; queries: site list, audit, results (a floor, from the route files).
    expect(probed.length).toBeGreaterThan(40)
  })

  it.each(probed.map(p => [`${p.rule.method} ${p.rule.path}`, p] as const))('%s', async (_name, { rule, module }) => {
    const role: RoleName = typeof rule.allowed === 'string' ? 'admin' : rule.allowed.includes('admin') ? 'admin' : rule.allowed[0]!
    const client = clients[role]
    const path = pathFor(rule, fixtureIds.get(module.file)!)
    await fc.assert(fc.asyncProperty(queryArb, bodyArb(rule), fc.constantFrom('application/json', 'text/plain', 'application/x-www-form-urlencoded'), async (query, body, type) => {
      const res = await fetch(`${client.baseUrl}${path}${query ? `?${query}` : ''}`, {
        method: rule.method,
        headers: { cookie: client.cookie, 'content-type': type },
        body: rule.method === 'GET' ? undefined : body,
        redirect: 'manual',
      })
      const text = await res.text()
      expect(res.status, `${rule.method} ${path} body (${type}) ${body.slice(0, 300)} query ${query.slice(0, 200)} → ${text.slice(0, 300)}`).toBeLessThan(500)
    }), { seed: 1313, numRuns: 15, endOnFailure: true })
  }, 120_000)
})
