// The one error contract. Every failure a person can act on answers with its status, a readable
// message (`statusMessage`) and, when it is about particular fields, `data.fields` (dotted field
// path → message) for the form to show beside them. Routes throw through the helpers below; code
// outside a request (services also run by scripts and workers) throws `AppError`, and the Nitro
// error hook (server/plugins/errors.ts) answers it, the engine's and calibration's input errors and
// zod errors in the same shape. 404 is also the answer for another organisation's rows (no existence leak).
import { createError } from 'h3'
import { z } from 'zod'
import { EngineInputError } from '../../shared/engine/assumptions'
import { CalibrationInputError } from '../../shared/calibration/errors'
import { fieldMessages, type FieldMessages } from '../../shared/schemas/messages'

/** A failure with the status it answers with; thrown by services that do not know about requests. */
export class AppError extends Error {
  constructor(readonly statusCode: number, message: string, readonly fields?: FieldMessages) {
    super(message)
    this.name = 'AppError'
  }
}

/**
 * Throws the error answer: status, readable message and, when given, `data.fields`; `counts` adds
 * figures beside them (e.g. `errorCount` when only the first of many problems are listed).
 */
export function fail(statusCode: number, message: string, fields?: FieldMessages, counts?: Record<string, number>): never {
  throw createError({ statusCode, statusMessage: message, data: fields || counts ? { ...(fields ? { fields } : {}), ...counts } : undefined })
}

/** A problem with one field: its message is the answer's message and the field's. */
export function fieldProblem(field: string, message: string, statusCode = 400): never {
  fail(statusCode, message, { [field]: message })
}

export function notFound(what: string): never {
  fail(404, `${what} not found.`)
}

export function badRequest(message: string, fields?: FieldMessages): never {
  fail(400, message, fields)
}

export function forbidden(message: string): never {
  fail(403, message)
}

export function conflict(message: string): never {
  fail(409, message)
}

export function tooLarge(message: string): never {
  fail(413, message)
}

/**
 * A failed validation as a 400: the first problem in words as the message, and every field's
 * message in `data.fields` (field path → message) for the form to show beside its fields.
 */
export function invalidInput(error: z.ZodError): never {
  badRequest(error.issues[0]?.message ?? 'The request is not valid.', fieldMessages(error.issues))
}

export interface ErrorAnswer { statusCode: number, message: string, fields?: FieldMessages }

/** The answer for an error thrown by a service, the engine, a calibration or zod; null for anything else. */
export function errorAnswer(error: unknown): ErrorAnswer | null {
  if (error instanceof AppError) return { statusCode: error.statusCode, message: error.message, fields: error.fields }
  if (error instanceof EngineInputError) return { statusCode: 400, message: error.message, fields: error.fields }
  if (error instanceof CalibrationInputError) return { statusCode: 400, message: error.message }
  if (error instanceof z.core.$ZodError) return { statusCode: 400, message: error.issues[0]?.message ?? 'The request is not valid.', fields: fieldMessages(error.issues) }
  return null
}
