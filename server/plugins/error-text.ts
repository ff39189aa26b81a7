// Error answers never carry unbounded text from the request: an error's message (for instance a
// not-found page naming the address asked for), and any text field of its data, is cut to 200
// characters, control characters removed, before the error page or JSON answer is rendered. The 'error' hook runs synchronously
// ahead of the error handler, on the same error object.
const MAX_MESSAGE_LENGTH = 200

export function boundedText(text: string): string {
  // eslint-disable-next-line no-control-regex
  const clean = text.replace(/[\u0000-\u001f\u007f]/g, ' ')
  return clean.length <= MAX_MESSAGE_LENGTH ? clean : `${clean.slice(0, MAX_MESSAGE_LENGTH - 1)}…`
}

export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('error', (error) => {
    const e = error as Error & { statusMessage?: string, data?: unknown }
    if (typeof e.statusMessage === 'string') e.statusMessage = boundedText(e.statusMessage)
    if (typeof e.message === 'string') e.message = boundedText(e.message)
    // Nuxt's not-found error repeats the path in data.path; field messages stay as they are.
    if (e.data && typeof e.data === 'object' && !Array.isArray(e.data)) {
      const data = e.data as Record<string, unknown>
      for (const [key, value] of Object.entries(data)) if (typeof value === 'string') data[key] = boundedText(value)
    }
  })
})
