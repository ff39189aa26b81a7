// Role × route rules for storm reports (issue 22): reports, exports and alert subscriptions for
// every role but viewers (PRODUCT.md: asset managers and underwriters, analysts, admins); uploads
// for analysts and admins; feeds and the alert threshold for admins; the feed endpoint itself is
// authenticated by the feed's bearer token, not by a session.
import type pg from 'pg'
import type { RoleName, RouteRule } from './types'

const readers: RoleName[] = ['admin', 'analyst', 'underwriter', 'asset_manager']
const editors: RoleName[] = ['admin', 'analyst']
const admins: RoleName[] = ['admin']

export const rules: RouteRule[] = [
  { method: 'POST', file: 'server/api/storms/feed.post.ts', path: '/api/storms/feed', allowed: 'token' },
  { method: 'POST', file: 'server/api/storms/uploads.post.ts', path: '/api/storms/uploads', allowed: editors },
  { method: 'GET', file: 'server/api/storms/feeds/index.get.ts', path: '/api/storms/feeds', allowed: admins },
  { method: 'POST', file: 'server/api/storms/feeds/index.post.ts', path: '/api/storms/feeds', allowed: admins },
  { method: 'DELETE', file: 'server/api/storms/feeds/[id].delete.ts', path: '/api/storms/feeds/[id]', allowed: admins, params: { id: 'feedId' } },
  { method: 'GET', file: 'server/api/storms/windows/index.get.ts', path: '/api/storms/windows', allowed: readers },
  { method: 'GET', file: 'server/api/storms/windows/[id].get.ts', path: '/api/storms/windows/[id]', allowed: readers, params: { id: 'windowId' } },
  { method: 'GET', file: 'server/api/storms/windows/[id]/export.get.ts', path: '/api/storms/windows/[id]/export', allowed: readers, params: { id: 'windowId' } },
  { method: 'GET', file: 'server/api/storms/alert-settings.get.ts', path: '/api/storms/alert-settings', allowed: readers },
  { method: 'PUT', file: 'server/api/storms/alert-settings.put.ts', path: '/api/storms/alert-settings', allowed: admins },
  { method: 'PUT', file: 'server/api/storms/alert-subscription.put.ts', path: '/api/storms/alert-subscription', allowed: readers },
]

/** A storm window and a feed in the organisation. */
export async function fixtures(pool: pg.Pool, organisationId: string): Promise<Record<string, string>> {
  const window = await pool.query(
    `INSERT INTO storm_windows (organisation_id, starts_at, ends_at, flash_count, state) VALUES ($1, now() - interval '1 hour', now(), 0, 'computed') RETURNING id`,
    [organisationId],
  )
  const feed = await pool.query(
    `INSERT INTO storm_feeds (organisation_id, name, token_hash, token_hint) VALUES ($1, 'Fixture feed', md5(random()::text), 'abcd') RETURNING id`,
    [organisationId],
  )
  return { windowId: window.rows[0].id, feedId: feed.rows[0].id }
}
