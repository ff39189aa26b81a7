// Forms and request bodies of accounts: sign-in, passwords, invitations, members, audit filters.
// Used by the pages (messages shown by the field) and by the routes (readValidatedBody).
import { z } from 'zod'
import { ROLE_NAMES } from '../roles'

export const PASSWORD_MIN_LENGTH = 12
/** scrypt work grows with the input; an upper bound keeps one request from tying up a core. */
export const PASSWORD_MAX_LENGTH = 200

const roleEnum = z.enum(ROLE_NAMES, { message: 'Choose a role.' })
const email = z.string().trim().toLowerCase().email('Enter an e-mail address.').max(254, 'That e-mail address is too long.')

export const signInSchema = z.object({
  email,
  password: z.string().min(1, 'Enter your password.').max(PASSWORD_MAX_LENGTH, 'That password is too long.'),
})
export type SignInInput = z.infer<typeof signInSchema>

export const newPasswordSchema = z.string()
  .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters.`)
  .max(PASSWORD_MAX_LENGTH, `Use at most ${PASSWORD_MAX_LENGTH} characters.`)

/**
 * The rule a schema cannot see on its own: the password must not be the person's e-mail address
 * (nor the part before the @). Returns the message to show, or null when the password is fine.
 */
export function passwordProblem(password: string, emailAddress: string): string | null {
  const parsed = newPasswordSchema.safeParse(password)
  if (!parsed.success) return parsed.error.issues[0]!.message
  const p = password.trim().toLowerCase()
  const e = emailAddress.trim().toLowerCase()
  if (p === e || (e.includes('@') && p === e.slice(0, e.indexOf('@')))) return 'The password must not be your e-mail address.'
  return null
}

export const changePasswordSchema = z.object({
  currentPassword: z.string().min(1, 'Enter your current password.').max(PASSWORD_MAX_LENGTH),
  newPassword: newPasswordSchema,
})

export const profileSchema = z.object({
  name: z.string().trim().min(1, 'Enter your name.').max(120, 'Use at most 120 characters.'),
})

export const switchOrganisationSchema = z.object({
  organisationId: z.string().uuid('Choose an organisation.'),
})

export const resetRequestSchema = z.object({ email })

export const resetConfirmSchema = z.object({ password: newPasswordSchema })

export const tokenParamsSchema = z.object({ token: z.string().min(20).max(100).regex(/^[\w-]+$/) })

export const inviteSchema = z.object({ email, role: roleEnum })
export type InviteInput = z.infer<typeof inviteSchema>

/**
 * Accepting an invitation: a new account gives a name and a password; an existing account accepts
 * while signed in as the invited address, or gives its current password to sign in and accept.
 */
export const acceptInvitationSchema = z.object({
  name: z.string().trim().min(1, 'Enter your name.').max(120, 'Use at most 120 characters.').optional(),
  password: newPasswordSchema.optional(),
  currentPassword: z.string().min(1, 'Enter your password.').max(PASSWORD_MAX_LENGTH, 'That password is too long.').optional(),
})

export const memberUpdateSchema = z.object({ role: roleEnum })

export const auditQuerySchema = z.object({
  person: z.string().uuid().optional(),
  entity: z.string().trim().min(1).max(60).optional(),
  from: z.iso.date('Use a real calendar date like 2026-03-31.').optional(),
  to: z.iso.date('Use a real calendar date like 2026-03-31.').optional(),
  page: z.coerce.number().int().min(1).max(10_000).default(1),
})
export type AuditQuery = z.infer<typeof auditQuerySchema>

/** The audit export: the screen's filters (no page) and the file format. */
export const auditExportQuerySchema = auditQuerySchema.omit({ page: true }).extend({
  format: z.enum(['xlsx', 'csv'], 'Choose xlsx or csv.').default('xlsx'),
})

/** API tokens: the form proposes an expiry this many days ahead (a token lives at most one year). */
export const API_TOKEN_DEFAULT_DAYS = 90
const DAY_MS = 24 * 60 * 60 * 1000

/** The UTC calendar day `days` from `now`, as YYYY-MM-DD (the form's default expiry). */
export function apiTokenDefaultExpiry(now = Date.now(), days = API_TOKEN_DEFAULT_DAYS): string {
  return new Date(now + days * DAY_MS).toISOString().slice(0, 10)
}

/** A token's expiry: a UTC calendar day after today and at most one year ahead; it ends at that day's 23:59:59 UTC. */
export const apiTokenExpirySchema = z.string({ message: 'Choose an expiry date.' })
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Write the expiry as YYYY-MM-DD.')
  .refine(s => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s), 'That date does not exist.')
  .refine(s => Date.parse(`${s}T23:59:59Z`) > Date.now(), 'Choose an expiry after today.')
  .refine(s => Date.parse(`${s}T00:00:00Z`) <= Date.now() + 365 * DAY_MS, 'A token lives at most one year: choose a date within a year from today.')

export const createApiTokenSchema = z.object({
  name: z.string().trim().min(1, 'Name the token (e.g. what script uses it).').max(80, 'Use at most 80 characters.'),
  expiresOn: apiTokenExpirySchema,
  readOnly: z.boolean().default(false),
  /** The organisation it acts in; the current one when left out. */
  organisationId: z.uuid('Choose an organisation.').optional(),
})
export type CreateApiTokenInput = z.input<typeof createApiTokenSchema>
