// Cross-site request forgery: a state-changing request (POST, PUT, PATCH, DELETE) is refused (403)
// when the browser says it came from another origin — Sec-Fetch-Site other than same-origin/none,
// or an Origin that is not this app's. Clients that send neither header (scripts, tests, the
// command-line tools) are not browsers riding on someone's cookie and pass. A request that carries
// no cookie and an `Authorization: Bearer` API token brings its own credential, which no other site
// can make a browser send, so it passes whatever its Origin; one with a cookie keeps every check.
// Bodies: JSON routes take only application/json; the upload routes take their file types. A form
// post (urlencoded, multipart to a JSON route, text/plain) gets 415 before any handler reads it.
import { getRequestHeader, getRequestHost, type H3Event } from 'h3'
import { settings } from '~~/server/settings'

const STATE_CHANGING = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])

/** Upload routes and the body types they read (everything else under /api reads JSON). */
export const UPLOAD_TYPES: { path: string, types: string[] }[] = [
  { path: '/api/inventory/imports', types: ['multipart/form-data'] },
  { path: '/api/calibrations/lightning-files', types: ['text/csv', 'application/octet-stream', 'application/vnd.ms-excel'] },
  { path: '/api/storms/uploads', types: ['text/csv', 'application/octet-stream', 'application/vnd.ms-excel'] },
  { path: '/api/storms/feed', types: ['text/csv'] },
]

export function isOwnOrigin(event: H3Event, origin: string): boolean {
  let url: URL
  try {
    url = new URL(origin)
  } catch {
    return false // includes the opaque "null" origin of sandboxed frames and file: pages
  }
  if (url.origin === new URL(settings.publicUrl).origin) return true
  return url.host === getRequestHost(event, { xForwardedHost: settings.trustProxy })
}

function hasBody(event: H3Event): boolean {
  const length = getRequestHeader(event, 'content-length')
  return Boolean(getRequestHeader(event, 'transfer-encoding')) || (length !== undefined && length !== '0')
}

function mediaType(event: H3Event): string {
  return (getRequestHeader(event, 'content-type') ?? '').split(';')[0]!.trim().toLowerCase()
}

export default defineEventHandler((event) => {
  if (!STATE_CHANGING.has(event.method)) return
  const scripted = !getRequestHeader(event, 'cookie') && /^Bearer\s/i.test(getRequestHeader(event, 'authorization') ?? '')
  const site = getRequestHeader(event, 'sec-fetch-site')
  if (!scripted && site !== undefined && site !== 'same-origin' && site !== 'none') {
    throw createError({ statusCode: 403, statusMessage: 'This request came from another site and was refused.' })
  }
  const origin = getRequestHeader(event, 'origin')
  if (!scripted && origin !== undefined && !isOwnOrigin(event, origin)) {
    throw createError({ statusCode: 403, statusMessage: 'This request came from another site and was refused.' })
  }
  if (!event.path.startsWith('/api/') || !hasBody(event)) return
  const type = mediaType(event)
  const path = event.path.split('?')[0]!
  const upload = UPLOAD_TYPES.find(u => u.path === path)
  if (type === 'application/json' || upload?.types.includes(type)) return
  throw createError({
    statusCode: 415,
    statusMessage: upload
      ? `Send the file as ${upload.types[0]}.`
      : 'Send the request body as JSON (Content-Type: application/json).',
  })
})
