// POST /api/storms/feeds — a new feed for a lightning-data provider; answers its bearer token once
// (only its SHA-256 is kept). Audited without the token.
import { newToken } from '~~/server/accounts/tokens'
import { useDb } from '~~/server/db'
import { stormFeeds } from '~~/server/db/schema'
import { stormFeedSchema } from '~~/shared/schemas/storms'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.admins })
  const input = await readValidBody(event, stormFeedSchema)
  const { token, tokenHash } = newToken()
  const feed = await useDb().transaction(async (tx) => {
    const [row] = await tx.insert(stormFeeds).values({ organisationId: member.organisationId, name: input.name, tokenHash, tokenHint: token.slice(-4), createdBy: member.user.id })
      .returning({ id: stormFeeds.id, name: stormFeeds.name, tokenHint: stormFeeds.tokenHint, createdAt: stormFeeds.createdAt })
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'create', entity: 'storm_feed', entityId: row!.id, after: { name: input.name, tokenHint: row!.tokenHint } }, { tx, event })
    return row!
  })
  setResponseStatus(event, 201)
  return { ...feed, token }
})
