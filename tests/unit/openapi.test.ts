// The OpenAPI document (public/openapi.json) is what the routes say: generated from their own zod
// schemas by scripts/openapi.ts, complete (every route file an operation, every body and query with
// its schema) and not stale. Fails when a route reads input without a schema or nobody regenerated it.
import { spawnSync } from 'node:child_process'
import { readdirSync, readFileSync, statSync } from 'node:fs'
import { join, resolve } from 'node:path'
import { describe, expect, it } from 'vitest'

const root = resolve(import.meta.dirname, '../..')
const files = (dir: string): string[] => readdirSync(dir).flatMap(f => (statSync(join(dir, f)).isDirectory() ? files(join(dir, f)) : f.endsWith('.ts') ? [join(dir, f)] : []))

describe('the OpenAPI document', () => {
  it('is generated from the routes, complete and current (`npm run openapi` regenerates it)', () => {
    const r = spawnSync(resolve(root, 'node_modules/.bin/tsx'), ['--tsconfig', '.nuxt/tsconfig.server.json', 'scripts/openapi.ts', '--check'], { cwd: root, encoding: 'utf8', timeout: 120_000 })
    expect(r.status, `${r.stdout}\n${r.stderr}`).toBe(0)
  }, 150_000)

  it('has one operation per route file, with the route\'s schemas and roles', () => {
    const doc = JSON.parse(readFileSync(resolve(root, 'public/openapi.json'), 'utf8')) as { paths: Record<string, Record<string, { requestBody?: { content: Record<string, { schema: { properties?: Record<string, unknown> } }> }, parameters?: { name: string, in: string }[], 'x-roles': string[] }>> }
    const operations = Object.values(doc.paths).reduce((n, p) => n + Object.keys(p).length, 0)
    expect(operations).toBe(files(resolve(root, 'server/api')).length)
    // A body schema as the route reads it (shared/schemas/notes.ts referralUpdateSchema), and its guard's roles (ROLES.contributors).
    const patch = doc.paths['/api/referrals/{id}']!.patch!
    expect(Object.keys(patch.requestBody!.content['application/json']!.schema.properties!)).toEqual(['status', 'assigneeId', 'dueOn'])
    expect(patch['x-roles']).toEqual(['admin', 'analyst', 'underwriter', 'asset_manager'])
    // A query schema becomes query parameters (shared/schemas/notes.ts referralListQuerySchema).
    expect(doc.paths['/api/referrals']!.get!.parameters!.map(p => `${p.in}:${p.name}`)).toEqual(['query:state', 'query:mine'])
    // An upload documents its file body (server/middleware/01.request-origin.ts).
    expect(Object.keys(doc.paths['/api/inventory/imports']!.post!.requestBody!.content)).toEqual(['multipart/form-data'])
  })
})
