// Referrals: an underwriter's note on a site with a status (open → in review → accepted or
// declined), an assignee in the organisation, a due date and a thread of replies. Underwriters and
// admins write and change them; the assignee may move the status and reply; every member but
// viewers may reply; everyone reads. The assignee is e-mailed when a referral is given to them.
// Every change is audited with its before and after.
import { aliasedTable, and, asc, desc, eq, inArray, sql } from 'drizzle-orm'
import type { H3Event } from 'h3'
import { OPEN_REFERRAL_STATUSES, REFERRAL_STATUSES, REFERRAL_STATUS_LABELS, type ReferralStatus } from '../../shared/schemas/notes'
import { useDb, type Database } from '../db'
import { memberships, siteNoteReplies, siteNotes, sites, users } from '../db/schema'
import { findReadableSite, readableSites } from '../inventory/access'
import { referralAssignedMail } from '../mail/templates'
import { recordAudit } from '../utils/audit'
import type { Member } from '../utils/auth'
import { fieldProblem, forbidden, notFound } from '../utils/errors'
import { appLink, queueMail } from '../utils/mail'

const UNDERWRITING = new Set(['admin', 'underwriter'])
const assignee = aliasedTable(users, 'assignee')
const author = aliasedTable(users, 'author')

export interface ReferralReply { id: string, body: string, author: string | null, createdAt: Date }
export interface Referral {
  id: string, siteId: string, siteName: string, body: string, author: string | null, createdAt: Date, updatedAt: Date
  status: ReferralStatus, assignee: { id: string, name: string } | null, dueOn: string | null, replies: ReferralReply[]
}

/** Members of the organisation a referral may be given to (name order). */
export async function assignableMembers(organisationId: string) {
  return useDb().select({ id: users.id, name: users.name, role: memberships.role }).from(memberships).innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.organisationId, organisationId), eq(users.disabled, false))).orderBy(asc(users.name))
}

async function checkAssignee(db: Database, organisationId: string, userId: string | null): Promise<{ id: string, name: string, email: string } | null> {
  if (!userId) return null
  const [row] = await db.select({ id: users.id, name: users.name, email: users.email }).from(memberships).innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.organisationId, organisationId), eq(memberships.userId, userId), eq(users.disabled, false)))
  return row ?? fieldProblem('assigneeId', 'Choose a member of your organisation.')
}

/** The organisation's referrals matching `where`, with their threads (oldest reply first). */
async function referralsWhere(organisationId: string, where: ReturnType<typeof and>, order: 'newest' | 'due'): Promise<Referral[]> {
  const db = useDb()
  const rows = await db.select({
    id: siteNotes.id, siteId: siteNotes.siteId, siteName: sites.name, body: siteNotes.body, author: author.name, createdAt: siteNotes.createdAt,
    updatedAt: siteNotes.updatedAt, status: siteNotes.status, assigneeId: siteNotes.assigneeId, assigneeName: assignee.name, dueOn: siteNotes.dueOn,
  }).from(siteNotes).innerJoin(sites, eq(sites.id, siteNotes.siteId))
    .leftJoin(author, eq(author.id, siteNotes.authorId)).leftJoin(assignee, eq(assignee.id, siteNotes.assigneeId))
    .where(and(eq(siteNotes.organisationId, organisationId), readableSites(organisationId), where))
    .orderBy(...(order === 'due' ? [sql`${siteNotes.dueOn} asc nulls last`, desc(siteNotes.updatedAt)] : [desc(siteNotes.createdAt)]))
    .limit(1000)
  const replies = rows.length === 0 ? [] : await db.select({ id: siteNoteReplies.id, noteId: siteNoteReplies.noteId, body: siteNoteReplies.body, author: users.name, createdAt: siteNoteReplies.createdAt })
    .from(siteNoteReplies).leftJoin(users, eq(users.id, siteNoteReplies.authorId))
    .where(inArray(siteNoteReplies.noteId, rows.map(r => r.id))).orderBy(asc(siteNoteReplies.createdAt))
  const byNote = new Map<string, ReferralReply[]>()
  for (const r of replies) {
    if (!byNote.has(r.noteId)) byNote.set(r.noteId, [])
    byNote.get(r.noteId)!.push({ id: r.id, body: r.body, author: r.author, createdAt: r.createdAt })
  }
  return rows.map(r => ({
    id: r.id, siteId: r.siteId, siteName: r.siteName, body: r.body, author: r.author, createdAt: r.createdAt, updatedAt: r.updatedAt, status: r.status,
    assignee: r.assigneeId ? { id: r.assigneeId, name: r.assigneeName ?? 'former member' } : null, dueOn: r.dueOn, replies: byNote.get(r.id) ?? [],
  }))
}

export async function siteReferrals(member: Member, siteId: string): Promise<Referral[]> {
  const { site } = await findReadableSite(member, siteId)
  return referralsWhere(member.organisationId, and(eq(siteNotes.siteId, site.id)), 'newest')
}

/** The organisation's referrals across every site it reads: open ones (open, in review) by due date by default. */
export async function listReferrals(member: Member, query: { state: 'open' | 'closed' | 'all', mine: boolean }): Promise<Referral[]> {
  const states = query.state === 'open' ? OPEN_REFERRAL_STATUSES : query.state === 'closed' ? REFERRAL_STATUSES.filter(s => !OPEN_REFERRAL_STATUSES.includes(s)) : REFERRAL_STATUSES
  return referralsWhere(member.organisationId, and(inArray(siteNotes.status, [...states]), query.mine ? eq(siteNotes.assigneeId, member.user.id) : undefined), 'due')
}

async function mailAssignee(member: Member, to: { email: string, name: string }, note: { id: string, body: string, dueOn: string | null }, siteName: string) {
  await queueMail(to.email, referralAssignedMail({
    organisationName: member.organisationName, siteName, by: member.user.name, body: note.body, dueOn: note.dueOn, link: appLink(`/referrals?note=${note.id}`),
  }), { organisationId: member.organisationId })
}

export async function createReferral(event: H3Event, member: Member, siteId: string, input: { body: string, assigneeId: string | null, dueOn: string | null }) {
  const { site } = await findReadableSite(member, siteId)
  const db = useDb()
  const to = await checkAssignee(db, member.organisationId, input.assigneeId)
  const note = await db.transaction(async (tx) => {
    const [row] = await tx.insert(siteNotes).values({ organisationId: member.organisationId, siteId: site.id, authorId: member.user.id, body: input.body, assigneeId: to?.id ?? null, dueOn: input.dueOn }).returning()
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'create', entity: 'site_note', entityId: row!.id, after: { siteId: site.id, body: input.body, status: 'open', assignee: to?.name ?? null, dueOn: input.dueOn } }, { tx, event })
    return row!
  })
  if (to && to.id !== member.user.id) await mailAssignee(member, to, note, site.name)
  return { ...note, author: member.user.name, assignee: to ? { id: to.id, name: to.name } : null, replies: [] }
}

/** The organisation's note, locked for a change; 404 for another organisation's or an unreadable site's. */
async function lockedNote(tx: Database, member: Member, noteId: string) {
  const [row] = await tx.select({ note: siteNotes, siteName: sites.name }).from(siteNotes).innerJoin(sites, eq(sites.id, siteNotes.siteId))
    .where(and(eq(siteNotes.id, noteId), eq(siteNotes.organisationId, member.organisationId), readableSites(member.organisationId))).for('update', { of: siteNotes })
  return row ?? notFound('Referral')
}

export async function updateReferral(event: H3Event, member: Member, noteId: string, patch: { status?: ReferralStatus, assigneeId?: string | null, dueOn?: string | null }) {
  const db = useDb()
  const to = patch.assigneeId === undefined ? undefined : await checkAssignee(db, member.organisationId, patch.assigneeId)
  const result = await db.transaction(async (tx) => {
    const { note, siteName } = await lockedNote(tx as never, member, noteId)
    const underwriting = UNDERWRITING.has(member.role)
    if (!underwriting) {
      if (note.assigneeId !== member.user.id) forbidden('Only underwriters, admins and the person the referral is assigned to may change it.')
      if (patch.assigneeId !== undefined || patch.dueOn !== undefined) forbidden('The person a referral is assigned to may change its status; underwriters and admins change the assignee and the due date.')
    }
    const before: Record<string, unknown> = {}
    const after: Record<string, unknown> = {}
    const set: Partial<typeof siteNotes.$inferInsert> = {}
    if (patch.status !== undefined && patch.status !== note.status) {
      set.status = patch.status; before.status = REFERRAL_STATUS_LABELS[note.status]; after.status = REFERRAL_STATUS_LABELS[patch.status]
    }
    if (to !== undefined && (to?.id ?? null) !== note.assigneeId) {
      const [old] = note.assigneeId ? await tx.select({ name: users.name }).from(users).where(eq(users.id, note.assigneeId)) : []
      set.assigneeId = to?.id ?? null; before.assignee = old?.name ?? null; after.assignee = to?.name ?? null
    }
    if (patch.dueOn !== undefined && patch.dueOn !== note.dueOn) {
      set.dueOn = patch.dueOn; before.dueOn = note.dueOn; after.dueOn = patch.dueOn
    }
    if (Object.keys(set).length === 0) return { note, siteName, newAssignee: false }
    const [row] = await tx.update(siteNotes).set({ ...set, updatedAt: new Date() }).where(eq(siteNotes.id, note.id)).returning()
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'update', entity: 'site_note', entityId: note.id, before, after }, { tx, event })
    return { note: row!, siteName, newAssignee: 'assigneeId' in set }
  })
  // Mailed only when the referral is given to someone new (not for a status change, not to oneself).
  if (result.newAssignee && to && to.id !== member.user.id) await mailAssignee(member, to, result.note, result.siteName)
  return (await referralsWhere(member.organisationId, and(eq(siteNotes.id, noteId)), 'newest'))[0]!
}

export async function addReply(event: H3Event, member: Member, noteId: string, body: string) {
  return useDb().transaction(async (tx) => {
    const { note } = await lockedNote(tx as never, member, noteId)
    const [reply] = await tx.insert(siteNoteReplies).values({ noteId: note.id, organisationId: member.organisationId, authorId: member.user.id, body }).returning()
    await tx.update(siteNotes).set({ updatedAt: new Date() }).where(eq(siteNotes.id, note.id))
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'create', entity: 'site_note_reply', entityId: reply!.id, after: { noteId: note.id, body } }, { tx, event })
    return { id: reply!.id, body: reply!.body, author: member.user.name, createdAt: reply!.createdAt }
  })
}
