// Errors a person can act on. 404 is also the answer for another organisation's rows (no existence leak).
import type { z } from 'zod'

export function notFound(what: string): never {
  throw createError({ statusCode: 404, statusMessage: `${what} not found.` })
}

export function badRequest(message: string, data?: unknown): never {
  throw createError({ statusCode: 400, statusMessage: message, data })
}

export function conflict(message: string): never {
  throw createError({ statusCode: 409, statusMessage: message })
}

export function tooLarge(message: string): never {
  throw createError({ statusCode: 413, statusMessage: message })
}

/**
 * A failed validation as a 400: the first problem in words as the message, and every field's
 * message in `data.fields` (field path → message) for the form to show beside its fields.
 */
export function invalidInput(error: z.ZodError): never {
  const fields: Record<string, string> = {}
  for (const issue of error.issues) fields[issue.path.map(String).join('.')] ??= issue.message
  badRequest(error.issues[0]?.message ?? 'The request is not valid.', { fields })
}
