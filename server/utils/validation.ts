// The one way routes read their input: the JSON body, the query string and the route parameters,
// each checked with a shared zod schema. Problems answer 400 in words (shared/schemas/messages.ts)
// with `data.fields`; a body that is not JSON says so; text holding a NUL character (which
// PostgreSQL cannot store) is refused before it reaches a query; an oversized body answers 413.
import type { H3Event } from 'h3'
import { z } from 'zod'
import { inWords } from '~~/shared/schemas/messages'

/** The largest JSON body a route reads (a terms version of 50,000 sites fits). */
export const MAX_JSON_BYTES = 16 * 1024 * 1024

/** The path (dotted) of the first string holding U+0000, or null. Depth-bounded: JSON nesting is shallow here. */
export function findNul(value: unknown, path: string[] = [], depth = 0): string[] | null {
  if (typeof value === 'string') return value.includes('\u0000') ? path : null
  if (depth > 64 || value === null || typeof value !== 'object') return null
  for (const [key, v] of Object.entries(value)) {
    if (key.includes('\u0000')) return [...path, key.replaceAll('\u0000', '')]
    const found = findNul(v, [...path, key], depth + 1)
    if (found) return found
  }
  return null
}

/** Checks `value` with `schema`; refuses NUL characters first. */
export function validateInput<T extends z.ZodType>(schema: T, value: unknown): z.output<T> {
  const nul = findNul(value)
  if (nul) {
    const where = nul.length ? ` from ${nul.join('.').slice(0, 100)}` : ''
    badRequest(`Remove the NUL character (\\0)${where}: text may not contain it.`, nul.length ? { [nul.join('.')]: 'Remove the NUL character (\\0).' } : undefined)
  }
  const parsed = schema.safeParse(value, { error: inWords })
  if (!parsed.success) invalidInput(parsed.error)
  return parsed.data
}

/** The request body as JSON (an empty body reads as `{}`), or a 400 saying it is not JSON. */
export async function readJsonBody(event: H3Event): Promise<unknown> {
  const declared = Number(getRequestHeader(event, 'content-length') ?? 0)
  if (declared > MAX_JSON_BYTES) tooLarge(`The request body is larger than ${MAX_JSON_BYTES / 1024 / 1024} MB, the limit.`)
  const raw = await readRawBody(event, 'utf8')
  if (raw === undefined || raw.trim() === '') return {}
  if (raw.length > MAX_JSON_BYTES) tooLarge(`The request body is larger than ${MAX_JSON_BYTES / 1024 / 1024} MB, the limit.`)
  try {
    return JSON.parse(raw) as unknown
  } catch {
    badRequest('The request body is not valid JSON.')
  }
}

export async function readValidBody<T extends z.ZodType>(event: H3Event, schema: T): Promise<z.output<T>> {
  return validateInput(schema, await readJsonBody(event))
}

export function readValidQuery<T extends z.ZodType>(event: H3Event, schema: T): z.output<T> {
  return validateInput(schema, getQuery(event))
}

/**
 * The one id reader: the route's `name` parameter (default `id`) as a uuid. A malformed id names no
 * row, so it answers like an id that matches nothing (or another organisation's row): 404
 * "<what> not found.".
 */
export function readId(event: H3Event, what: string, name = 'id'): string {
  const parsed = z.uuid().safeParse(getRouterParam(event, name, { decode: true }))
  if (!parsed.success) notFound(what)
  return parsed.data
}

/** Route parameters that are not ids (e-mailed tokens), checked with their schema. */
export function readValidParams<T extends z.ZodType>(event: H3Event, schema: T): z.output<T> {
  return validateInput(schema, getRouterParams(event, { decode: true }))
}
