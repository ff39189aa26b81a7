// The signed-in person, their organisation and role, as the frame shows them; and the account actions.
import { passwordProblem } from '~~/shared/schemas/auth'
import { roleLabels } from '~~/shared/roles'
import { fieldMessages, inWords } from '~~/shared/schemas/messages'

export function useAccount() {
  const { session, user, loggedIn, fetch, clear } = useUserSession()
  const role = computed(() => session.value?.role ?? null)
  const roleLabel = computed(() => (role.value ? roleLabels[role.value] : ''))
  /** The organisation's currency code (money is shown in it everywhere). */
  const currency = computed(() => session.value?.currency ?? 'USD')

  async function signOut() {
    await $fetch('/api/auth/sign-out', { method: 'POST' }).catch(() => {})
    await clear()
    await navigateTo('/sign-in')
  }

  async function switchOrganisation(organisationId: string) {
    await $fetch('/api/auth/switch-organisation', { method: 'POST', body: { organisationId } })
    await fetch()
    await navigateTo('/overview')
    await refreshNuxtData()
  }

  return { session, user, loggedIn, role, roleLabel, currency, refresh: fetch, signOut, switchOrganisation }
}

/** The message of a failed $fetch, for showing beside a form. */
export function errorMessage(error: unknown, fallback = 'Something went wrong. Try again.'): string {
  const e = error as { data?: { statusMessage?: string, message?: string }, statusMessage?: string }
  return e?.data?.statusMessage ?? e?.statusMessage ?? e?.data?.message ?? fallback
}

/**
 * Field messages from a 400 answer: the server's one shape, `data.fields` (dotted field path →
 * message, server/utils/validation.ts), keyed by the same dotted paths as `validateForm` and
 * `useSchemaForm` give, so a message lands beside its control whichever side found it.
 */
export function fieldErrors(error: unknown): Record<string, string> {
  const data: unknown = (error as { data?: { data?: unknown } } | null)?.data?.data
  const fields: unknown = data && typeof data === 'object' && 'fields' in data ? data.fields : null
  const out: Record<string, string> = {}
  if (!fields || typeof fields !== 'object') return out
  for (const [path, message] of Object.entries(fields)) if (typeof message === 'string') out[path] ??= message
  return out
}

type ParseParams = { error: typeof inWords }
/** Validates form values with the zod schema the route uses; returns the first message per field, in words. */
export function validateForm<T>(schema: { safeParse: (v: unknown, params?: ParseParams) => { success: true, data: T } | { success: false, error: { issues: { path: PropertyKey[], message: string }[] } } }, values: unknown): { data?: T, errors: Record<string, string> } {
  const result = schema.safeParse(values, { error: inWords })
  if (result.success) return { data: result.data, errors: {} }
  return { errors: fieldMessages(result.error.issues) }
}

/** Clears a field's message as soon as the person edits that field. */
export function clearErrorsOnEdit(form: Record<string, unknown>, errors: Ref<Record<string, string>>) {
  watch(() => ({ ...form }), (now, before) => {
    for (const key of Object.keys(now)) {
      if (now[key] !== before[key] && errors.value[key]) {
        const { [key]: _gone, ...rest } = errors.value
        errors.value = rest
      }
    }
  })
}

/** Messages for a new password typed twice: the rules (shared with the server) and the repeat. */
export function newPasswordErrors(password: string, repeat: string, email: string, field = 'password'): Record<string, string> {
  const errors: Record<string, string> = {}
  const problem = passwordProblem(password, email)
  if (problem) errors[field] = problem
  if (repeat !== password) errors.repeat = 'The two passwords differ.'
  return errors
}
