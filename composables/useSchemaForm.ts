// The one client form composable: a form validated by the same zod schema the route uses, messages by
// dotted field path, and the server's field messages (400 with data.fields, read by fieldErrors) shown
// in the same places.
import type { z } from 'zod'
import { fieldMessages, inWords } from '~~/shared/schemas/messages'

export function useSchemaForm<T extends z.ZodType>(schema: T) {
  const errors = ref<Record<string, string>>({})
  const formError = ref('')
  const saving = ref(false)

  function validate(values: unknown): z.output<T> | null {
    const parsed = schema.safeParse(values, { error: inWords })
    errors.value = {}
    formError.value = ''
    if (parsed.success) return parsed.data
    errors.value = fieldMessages(parsed.error.issues)
    formError.value = 'Some fields need attention; see the messages beside them.'
    return null
  }

  /** Runs a request; a 400/409 from the server lands beside the fields or above the form. */
  async function submit<R>(request: () => Promise<R>): Promise<R | null> {
    saving.value = true
    try {
      return await request()
    } catch (error) {
      const e = error as { data?: { statusMessage?: string, message?: string } }
      errors.value = fieldErrors(error)
      formError.value = e.data?.statusMessage ?? e.data?.message ?? 'The change could not be saved. Try again.'
      return null
    } finally {
      saving.value = false
    }
  }

  /** The message at a dotted path, or the first one below it (a list's `series.3.levelKv` for `series`). */
  function errorAt(path: string): string | undefined {
    return errors.value[path] ?? Object.entries(errors.value).find(([key]) => key.startsWith(`${path}.`))?.[1]
  }

  return { errors, formError, saving, validate, submit, errorAt }
}

/** Whether the signed-in role may change the inventory (the server checks again). */
export function useCanEditInventory() {
  const { may } = useRole()
  return computed(() => may('editInventory'))
}

/** An optional number input: '' → null. */
export function numberOrNull(v: unknown): number | null {
  if (v === '' || v === null || v === undefined) return null
  const n = typeof v === 'number' ? v : Number(v)
  return Number.isNaN(n) ? (v as number) : n
}
