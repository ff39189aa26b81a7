// Errors a person can act on. 404 is also the answer for another organisation's rows (no existence leak).
export function notFound(what: string): never {
  throw createError({ statusCode: 404, statusMessage: `${what} not found.` })
}

export function badRequest(message: string, data?: unknown): never {
  throw createError({ statusCode: 400, statusMessage: message, data })
}

export function conflict(message: string): never {
  throw createError({ statusCode: 409, statusMessage: message })
}
