// Invitations: an admin invites an address with a role; the e-mailed link works once, for 7 days.
// Accepting creates the account (name and password) or, with that person's consent (signed in, or
// their password), adds the membership to an existing one.
import { and, desc, eq, isNull } from 'drizzle-orm'
import { createError, type H3Event } from 'h3'
import { useDb } from '../db'
import { invitations, memberships, organisations, users } from '../db/schema'
import { invitationMail } from '../mail/templates'
import type { Member } from '../utils/auth'
import { conflict, fail, fieldProblem, notFound } from '../utils/errors'
import { recordAudit } from '../utils/audit'
import { appLink, queueMail } from '../utils/mail'
import { memberOfSession, startMemberSession } from '../utils/auth'
import { clientAddress } from '../utils/client-address'
import { INVITATION_LIFETIME_MS, hashToken, newToken } from './tokens'
import { assertSignInAllowed, recordSignInAttempt } from './sign-in-throttle'
import { assertPasswordAllowed, checkPassword } from './passwords'

type Invitation = typeof invitations.$inferSelect
export type InvitationStatus = 'pending' | 'accepted' | 'revoked' | 'expired'

export function invitationStatus(i: Pick<Invitation, 'acceptedAt' | 'revokedAt' | 'expiresAt'>, now = Date.now()): InvitationStatus {
  if (i.acceptedAt) return 'accepted'
  if (i.revokedAt) return 'revoked'
  return i.expiresAt.getTime() <= now ? 'expired' : 'pending'
}

export async function listInvitations(organisationId: string) {
  const rows = await useDb()
    .select({ id: invitations.id, email: invitations.email, role: invitations.role, createdAt: invitations.createdAt, expiresAt: invitations.expiresAt, acceptedAt: invitations.acceptedAt, revokedAt: invitations.revokedAt, invitedByName: users.name })
    .from(invitations)
    .leftJoin(users, eq(users.id, invitations.invitedById))
    .where(eq(invitations.organisationId, organisationId))
    .orderBy(desc(invitations.createdAt))
    .limit(500)
  return rows.map(r => ({ ...r, status: invitationStatus(r) }))
}

/** Sends a fresh link: a new token and a new 7-day expiry. The previous link stops working. */
async function mailInvitation(member: Member, invitation: Invitation, token: string) {
  await queueMail(invitation.email, invitationMail({
    organisationName: member.organisationName,
    role: invitation.role,
    invitedBy: member.user.name,
    link: appLink(`/invitations/${token}`),
    expiresAt: invitation.expiresAt,
  }), { organisationId: invitation.organisationId })
}

function publicView(i: Invitation) {
  return { id: i.id, email: i.email, role: i.role, createdAt: i.createdAt, expiresAt: i.expiresAt, status: invitationStatus(i) }
}

export async function createInvitation(event: H3Event, member: Member, email: string, role: Invitation['role']) {
  const db = useDb()
  const { token, tokenHash } = newToken()
  const invitation = await db.transaction(async (tx) => {
    const [existing] = await tx.select({ id: memberships.id }).from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .where(and(eq(memberships.organisationId, member.organisationId), eq(users.email, email)))
    if (existing) conflict(`${email} is already a member of ${member.organisationName}.`)
    // A new invitation replaces any open one for the same address: only the newest link works.
    await tx.update(invitations).set({ revokedAt: new Date() })
      .where(and(eq(invitations.organisationId, member.organisationId), eq(invitations.email, email), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
    const [row] = await tx.insert(invitations).values({
      organisationId: member.organisationId, email, role, tokenHash, invitedById: member.user.id,
      expiresAt: new Date(Date.now() + INVITATION_LIFETIME_MS),
    }).returning()
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'invite', entity: 'invitation', entityId: row!.id, after: { email, role } }, { tx, event })
    return row!
  })
  await mailInvitation(member, invitation, token)
  return publicView(invitation)
}

async function invitationOfOrganisation(id: string, organisationId: string, executor: Pick<ReturnType<typeof useDb>, 'select'>) {
  const [row] = await executor.select().from(invitations).where(and(eq(invitations.id, id), eq(invitations.organisationId, organisationId))).for('update')
  if (!row) notFound('Invitation')
  return row
}

export async function revokeInvitation(event: H3Event, member: Member, id: string) {
  return useDb().transaction(async (tx) => {
    const row = await invitationOfOrganisation(id, member.organisationId, tx)
    if (row.acceptedAt) conflict('This invitation was already accepted; remove the member instead.')
    if (row.revokedAt) return publicView(row)
    const [updated] = await tx.update(invitations).set({ revokedAt: new Date() }).where(eq(invitations.id, id)).returning()
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'revoke', entity: 'invitation', entityId: id, before: { email: row.email, role: row.role, status: invitationStatus(row) }, after: { status: 'revoked' } }, { tx, event })
    return publicView(updated!)
  })
}

export async function resendInvitation(event: H3Event, member: Member, id: string) {
  const { token, tokenHash } = newToken()
  const invitation = await useDb().transaction(async (tx) => {
    const row = await invitationOfOrganisation(id, member.organisationId, tx)
    if (row.acceptedAt) conflict('This invitation was already accepted.')
    const [updated] = await tx.update(invitations)
      .set({ tokenHash, revokedAt: null, expiresAt: new Date(Date.now() + INVITATION_LIFETIME_MS) })
      .where(eq(invitations.id, id)).returning()
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'resend', entity: 'invitation', entityId: id, before: { status: invitationStatus(row), expiresAt: row.expiresAt }, after: { status: 'pending', expiresAt: updated!.expiresAt } }, { tx, event })
    return updated!
  })
  await mailInvitation(member, invitation, token)
  return publicView(invitation)
}

const GONE = 'This invitation has expired, was withdrawn or was already used. Ask your administrator for a new one.'

/** The invitation behind a token, or 404 (unknown) / 410 (used, revoked or expired). */
async function usableInvitation(token: string, executor: Pick<ReturnType<typeof useDb>, 'select'>, lock: boolean) {
  const query = executor.select({ invitation: invitations, organisationName: organisations.name })
    .from(invitations)
    .innerJoin(organisations, eq(organisations.id, invitations.organisationId))
    .where(eq(invitations.tokenHash, hashToken(token)))
  const [row] = lock ? await query.for('update', { of: invitations }) : await query
  if (!row) throw createError({ statusCode: 404, statusMessage: 'This invitation link is not valid. Check that the whole link was copied.' })
  if (invitationStatus(row.invitation) !== 'pending') throw createError({ statusCode: 410, statusMessage: GONE })
  return row
}

/** The person signed in on this request (any organisation), or null. */
async function signedInUserId(event: H3Event): Promise<string | null> {
  const session = await getUserSession(event)
  if (!session.user?.id) return null
  return (await memberOfSession(session))?.user.id ?? null
}

export async function describeInvitation(event: H3Event, token: string) {
  const db = useDb()
  const { invitation, organisationName } = await usableInvitation(token, db, false)
  const [user] = await db.select({ id: users.id }).from(users).where(eq(users.email, invitation.email))
  const signedIn = await signedInUserId(event)
  return {
    email: invitation.email, role: invitation.role, organisationName, expiresAt: invitation.expiresAt,
    accountExists: Boolean(user),
    /** Signed in as the invited address: accepting needs only the click. */
    signedInAsInvitee: Boolean(user && signedIn === user.id),
    /** The address has an account and somebody else is signed in: they cannot accept it. */
    signedInAsOther: Boolean(user && signedIn && signedIn !== user.id),
  }
}

const SIGN_IN_TO_ACCEPT = 'You already have an account: sign in as the invited address (or give its password here) to accept.'

/**
 * Accepts once. A new address creates its account (name and password). An existing account is
 * added only with that person's consent: signed in as the invited address on this request, or
 * giving its current password (counted by sign-in throttling), which then signs them in.
 */
export async function acceptInvitation(event: H3Event, token: string, input: { name?: string, password?: string, currentPassword?: string }) {
  const signedIn = await signedInUserId(event)
  const result = await useDb().transaction(async (tx) => {
    const { invitation, organisationName } = await usableInvitation(token, tx, true)
    let [user] = await tx.select().from(users).where(eq(users.email, invitation.email))
    const created = !user
    let signInNow = false
    if (!user) {
      if (!input.name) fieldProblem('name', 'Enter your name.')
      if (!input.password) fieldProblem('password', 'Choose a password.')
      assertPasswordAllowed(input.password, invitation.email)
      ;[user] = await tx.insert(users).values({ email: invitation.email, name: input.name, passwordHash: await hashPassword(input.password), lastOrganisationId: invitation.organisationId }).returning()
      // The new person has just chosen their password: they are signed in (unless somebody else is
      // signed in in this browser, whose session is left as it is).
      signInNow = signedIn === null
    } else {
      if (signedIn && signedIn !== user.id) throw createError({ statusCode: 403, statusMessage: 'This invitation is for another address. Sign out, then sign in as the invited address to accept it.' })
      if (!signedIn) {
        if (!input.currentPassword) fail(401, SIGN_IN_TO_ACCEPT, { currentPassword: 'Enter your password to accept.' })
        await assertPasswordOfInvitee(event, user, input.currentPassword)
        signInNow = true
      }
      // The next sign-in lands in the organisation just joined.
      ;[user] = await tx.update(users).set({ lastOrganisationId: invitation.organisationId }).where(eq(users.id, user.id)).returning()
    }
    const [membership] = await tx.insert(memberships).values({ organisationId: invitation.organisationId, userId: user!.id, role: invitation.role })
      .onConflictDoNothing().returning()
    await tx.update(invitations).set({ acceptedAt: new Date(), acceptedById: user!.id }).where(eq(invitations.id, invitation.id))
    await recordAudit({
      organisationId: invitation.organisationId, userId: user!.id, action: 'accept_invitation', entity: 'membership',
      entityId: membership?.id ?? null, after: { email: invitation.email, role: invitation.role, accountCreated: created },
    }, { tx, event })
    return { user: user!, organisationId: invitation.organisationId, role: invitation.role, organisationName, created, signInNow }
  })
  // Work in the organisation just joined: a new session after a password, the same one when the
  // invitee was signed in already. Anyone else's session (a new account made while signed in as
  // somebody) is left as it is.
  const continues = signedIn !== null && signedIn === result.user.id
  if (result.signInNow || continues) {
    const session = await getUserSession(event)
    await startMemberSession(event, result.user, { organisationId: result.organisationId, role: result.role }, result.signInNow ? undefined : session.sessionId)
  }
  return { ok: true, email: result.user.email, organisationName: result.organisationName, accountCreated: result.created, signedIn: result.signInNow || continues }
}

/** The existing account's password, checked like a sign-in (throttled, failures recorded). */
async function assertPasswordOfInvitee(event: H3Event, user: typeof users.$inferSelect, password: string) {
  const address = clientAddress(event)
  await assertSignInAllowed(event, user.email, address)
  if (user.disabled || !(await checkPassword(user.passwordHash, password))) {
    await recordSignInAttempt(user.email, address, false)
    fieldProblem('currentPassword', 'That password does not match the invited account.', 401)
  }
  await recordSignInAttempt(user.email, address, true)
}
