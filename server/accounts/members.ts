// Members of an organisation: list, change a role, remove — never leaving the organisation without an admin.
import { and, asc, eq, ne } from 'drizzle-orm'
import type { H3Event } from 'h3'
import { useDb } from '../db'
import { memberships, users, type Role } from '../db/schema'
import type { Member } from '../utils/auth'
import { conflict, notFound } from '../utils/errors'
import { recordAudit } from '../utils/audit'

type Tx = Parameters<Parameters<ReturnType<typeof useDb>['transaction']>[0]>[0]

export async function listMembers(organisationId: string) {
  return useDb()
    .select({ id: memberships.id, userId: users.id, name: users.name, email: users.email, role: memberships.role, joinedAt: memberships.createdAt, lastSignInAt: users.lastSignInAt })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.organisationId, organisationId))
    .orderBy(asc(users.name), asc(users.email))
}

/** The membership, locked for the change; 404 when it is not in the caller's organisation. */
async function lockedMembership(tx: Tx, organisationId: string, id: string) {
  const [row] = await tx.select({ id: memberships.id, userId: memberships.userId, role: memberships.role, email: users.email, name: users.name })
    .from(memberships).innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.id, id), eq(memberships.organisationId, organisationId)))
    .for('update', { of: memberships })
  if (!row) notFound('Member')
  return row
}

/** Refuses a change that would leave the organisation without an admin. Locks the admins' rows so two changes cannot race past it. */
async function assertAnotherAdmin(tx: Tx, organisationId: string, exceptMembershipId: string) {
  const others = await tx.select({ id: memberships.id }).from(memberships)
    .where(and(eq(memberships.organisationId, organisationId), eq(memberships.role, 'admin'), ne(memberships.id, exceptMembershipId)))
    .for('update')
  if (others.length === 0) conflict('An organisation keeps at least one admin. Make another member an admin first.')
}

export async function changeMemberRole(event: H3Event, member: Member, id: string, role: Role) {
  return useDb().transaction(async (tx) => {
    const row = await lockedMembership(tx, member.organisationId, id)
    if (row.role === role) return { id, role }
    if (row.role === 'admin') await assertAnotherAdmin(tx, member.organisationId, id)
    await tx.update(memberships).set({ role }).where(eq(memberships.id, id))
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'role_change', entity: 'membership', entityId: id, before: { email: row.email, role: row.role }, after: { email: row.email, role } }, { tx, event })
    return { id, role }
  })
}

export async function removeMember(event: H3Event, member: Member, id: string) {
  return useDb().transaction(async (tx) => {
    const row = await lockedMembership(tx, member.organisationId, id)
    if (row.role === 'admin') await assertAnotherAdmin(tx, member.organisationId, id)
    await tx.delete(memberships).where(eq(memberships.id, id))
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'delete', entity: 'membership', entityId: id, before: { email: row.email, name: row.name, role: row.role } }, { tx, event })
    return { ok: true }
  })
}
