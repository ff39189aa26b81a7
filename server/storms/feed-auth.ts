// The provider's side: a feed is named by its bearer token (only its SHA-256 is stored) and
// limited in how often it may post. Every attempt counts — stored, duplicate or refused — and is
// recorded in the database (storm_feed_attempts), so the limit holds across app processes.
import { and, count, eq, gt, isNull, lt, sql } from 'drizzle-orm'
import type { H3Event } from 'h3'
import { useDb } from '../db'
import { stormFeedAttempts, stormFeeds } from '../db/schema'
import { hashToken } from '../accounts/tokens'
import { fail } from '../utils/errors'

/** Posts one feed may make per minute (a provider posting every few seconds stays well inside). */
export const FEED_POSTS_PER_MINUTE = 30
const WINDOW_MS = 60_000

export async function requireFeed(event: H3Event) {
  const header = getRequestHeader(event, 'authorization') ?? ''
  const match = /^Bearer\s+(\S+)$/i.exec(header)
  if (!match) fail(401, 'Send the feed token as "Authorization: Bearer <token>".')
  const db = useDb()
  const [feed] = await db.select().from(stormFeeds).where(and(eq(stormFeeds.tokenHash, hashToken(match[1]!)), isNull(stormFeeds.revokedAt)))
  if (!feed) fail(401, 'This feed token is not known or was revoked.')
  // This attempt is recorded before anything else is read, so a refused or duplicate post counts too.
  const [attempt] = await db.insert(stormFeedAttempts).values({ feedId: feed.id }).returning({ at: stormFeedAttempts.attemptedAt })
  await db.delete(stormFeedAttempts).where(and(eq(stormFeedAttempts.feedId, feed.id), lt(stormFeedAttempts.attemptedAt, sql`now() - interval '10 minutes'`)))
  const since = new Date(attempt!.at.getTime() - WINDOW_MS)
  const inWindow = and(eq(stormFeedAttempts.feedId, feed.id), gt(stormFeedAttempts.attemptedAt, since))
  const [recent] = await db.select({ n: count() }).from(stormFeedAttempts).where(inWindow)
  const n = recent?.n ?? 0
  if (n > FEED_POSTS_PER_MINUTE) {
    // The next post is taken once enough attempts of this minute have aged out that it is the 30th.
    const [oldest] = await db.select({ at: stormFeedAttempts.attemptedAt }).from(stormFeedAttempts).where(inWindow)
      .orderBy(stormFeedAttempts.attemptedAt).offset(n - FEED_POSTS_PER_MINUTE).limit(1)
    const retryAfter = Math.max(1, Math.ceil(((oldest?.at.getTime() ?? attempt!.at.getTime()) + WINDOW_MS - attempt!.at.getTime()) / 1000))
    setResponseHeader(event, 'Retry-After', retryAfter)
    fail(429, `This feed made ${n} posts in the last minute; it may make ${FEED_POSTS_PER_MINUTE}. Try again in ${retryAfter} s, and post larger batches less often.`)
  }
  return feed
}
