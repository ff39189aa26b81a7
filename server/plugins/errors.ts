// The one error hook. Nitro's 'error' hook runs synchronously ahead of the error handler, on the
// same error object, so here:
// 1. an error thrown by a service (AppError), the engine (EngineInputError), a calibration
//    (CalibrationInputError) or zod becomes the answer routes give with the helpers of
//    server/utils/errors.ts: its status, a readable message and `data.fields` — instead of a 500;
// 2. error answers never carry unbounded text from the request: an error's message (for instance a
//    not-found page naming the address asked for), and any text field of its data, is cut to 200
//    characters, control characters removed, before the error page or JSON answer is rendered.
import { sanitizeStatusMessage, type H3Error } from 'h3'
import { errorAnswer } from '../utils/errors'

const MAX_MESSAGE_LENGTH = 200

export function boundedText(text: string): string {
  // eslint-disable-next-line no-control-regex
  const clean = text.replace(/[\u0000-\u001f\u007f]/g, ' ')
  return clean.length <= MAX_MESSAGE_LENGTH ? clean : `${clean.slice(0, MAX_MESSAGE_LENGTH - 1)}…`
}

/** h3 wraps what a handler throws; the thrown error is its cause. */
function answerThrown(e: H3Error): void {
  const answer = errorAnswer(e.cause) ?? errorAnswer(e)
  if (!answer) return
  e.statusCode = answer.statusCode
  e.statusMessage = sanitizeStatusMessage(answer.message) // as createError does: the reason phrase is ASCII
  e.message = answer.message
  e.data = answer.fields ? { fields: answer.fields } : undefined
  e.unhandled = false
}

export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('error', (error) => {
    const e = error as H3Error & { statusMessage?: string, data?: unknown }
    answerThrown(e)
    if (typeof e.statusMessage === 'string') e.statusMessage = boundedText(e.statusMessage)
    if (typeof e.message === 'string') e.message = boundedText(e.message)
    // Nuxt's not-found error repeats the path in data.path; field messages stay as they are.
    if (e.data && typeof e.data === 'object' && !Array.isArray(e.data)) {
      const data = e.data as Record<string, unknown>
      for (const [key, value] of Object.entries(data)) if (typeof value === 'string') data[key] = boundedText(value)
    }
  })
})
