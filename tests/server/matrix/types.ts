// The role × route matrix: every file under server/api/ has a rule here, in one module per domain
// (tests/server/matrix/<domain>.ts exporting `rules` and optionally `fixtures`).
// tests/server/role-matrix.test.ts discovers every route file, fails when one has no rule, and checks:
//   anonymous → 401 (unless 'public'); each role not allowed → 403; each allowed role → neither 401
//   nor 403 (with a random uuid for ids); and, for rules with `params`, that members of ANOTHER
//   organisation get 404 on the first organisation's fixture ids (never data).
// Routes call the guard before validating input, so these statuses hold whatever the body.
import type pg from 'pg'

export type RoleName = 'admin' | 'analyst' | 'underwriter' | 'asset_manager' | 'viewer'

export interface RouteRule {
  method: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE'
  /** e.g. 'server/api/sites/[id].get.ts' — must match a real file. */
  file: string
  /** e.g. '/api/sites/[id]' */
  path: string
  /**
   * Roles that pass the guard; others get 403, anonymous 401. 'public': no guard. 'token': the route
   * is authenticated by a bearer token of its own (e.g. a storm feed's), not by the session, so every
   * caller without that token — signed in with any role or not — gets 401.
   */
  allowed: RoleName[] | 'public' | 'token'
  /** Route param → fixture key, e.g. { id: 'siteId' }, for the cross-organisation probes. */
  params?: Record<string, string>
  /**
   * A body valid enough to reach the organisation-scoped lookup, sent with every call of the rule
   * (default {}). Needed where a route validates its body before looking the row up (e.g. a PATCH
   * with required fields): otherwise the cross-organisation probe gets 400 instead of 404.
   */
  body?: Record<string, unknown>
}

export interface MatrixModule {
  rules: RouteRule[]
  /** Creates the domain's records in an organisation; returns their ids by fixture key. */
  fixtures?: (pool: pg.Pool, organisationId: string) => Promise<Record<string, string>>
}
