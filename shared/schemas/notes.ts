import { z } from 'zod'

/** A referral's states, in the order it moves through them. */
export const REFERRAL_STATUSES = ['open', 'in_review', 'accepted', 'declined'] as const
export type ReferralStatus = (typeof REFERRAL_STATUSES)[number]
export const REFERRAL_STATUS_LABELS: Record<ReferralStatus, string> = { open: 'Open', in_review: 'In review', accepted: 'Accepted', declined: 'Declined' }
/** Statuses that still ask someone to act. */
export const OPEN_REFERRAL_STATUSES: readonly ReferralStatus[] = ['open', 'in_review']

const noteBody = z.string().trim().min(1, 'Write the note.').max(4000, 'At most 4,000 characters.')
/** A calendar day, YYYY-MM-DD (UTC), or none. */
const dueOn = z.iso.date('Enter a date as YYYY-MM-DD.').nullable()

export const siteNoteSchema = z.object({
  body: noteBody,
  assigneeId: z.uuid('Choose a member of your organisation.').nullable().default(null),
  dueOn: dueOn.default(null),
})

export const referralUpdateSchema = z.object({
  status: z.enum(REFERRAL_STATUSES, 'Choose open, in review, accepted or declined.').optional(),
  assigneeId: z.uuid('Choose a member of your organisation.').nullable().optional(),
  dueOn: dueOn.optional(),
}).refine(v => v.status !== undefined || v.assigneeId !== undefined || v.dueOn !== undefined, 'Change the status, the assignee or the due date.')

export const referralReplySchema = z.object({ body: noteBody })

export const referralListQuerySchema = z.object({
  /** open (open or in review, the default), closed (accepted or declined) or all. */
  state: z.enum(['open', 'closed', 'all']).default('open'),
  /** Only those assigned to the person asking. */
  mine: z.enum(['true', 'false']).default('false').transform(v => v === 'true'),
})
