// The provider's side: a feed is named by its bearer token (only its SHA-256 is stored) and
// limited in how often it may post.
import { and, count, eq, gt, isNull } from 'drizzle-orm'
import type { H3Event } from 'h3'
import { useDb } from '../db'
import { stormBatches, stormFeeds } from '../db/schema'
import { hashToken } from '../accounts/tokens'
import { fail } from '../utils/errors'

/** Batches one feed may post per minute (a provider posting every few seconds stays well inside). */
export const FEED_POSTS_PER_MINUTE = 30

export async function requireFeed(event: H3Event) {
  const header = getRequestHeader(event, 'authorization') ?? ''
  const match = /^Bearer\s+(\S+)$/i.exec(header)
  if (!match) fail(401, 'Send the feed token as "Authorization: Bearer <token>".')
  const [feed] = await useDb().select().from(stormFeeds).where(and(eq(stormFeeds.tokenHash, hashToken(match[1]!)), isNull(stormFeeds.revokedAt)))
  if (!feed) fail(401, 'This feed token is not known or was revoked.')
  const [recent] = await useDb().select({ n: count() }).from(stormBatches)
    .where(and(eq(stormBatches.feedId, feed.id), gt(stormBatches.createdAt, new Date(Date.now() - 60_000))))
  if ((recent?.n ?? 0) >= FEED_POSTS_PER_MINUTE) {
    setResponseHeader(event, 'Retry-After', 60)
    fail(429, `This feed posted ${FEED_POSTS_PER_MINUTE} batches in the last minute, the most it may; post larger batches less often.`)
  }
  return feed
}
