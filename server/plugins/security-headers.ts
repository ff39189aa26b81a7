// Security headers on every response — pages, API routes, assets and errors — and a nonce on every
// script the server renders, so the Content Security Policy needs no 'unsafe-inline' for scripts.
//   script-src 'self' + this response's nonce: Nuxt's bundles and its inline payload only;
//   style-src 'unsafe-inline': Vue and ECharts write style attributes (no script can run from them);
//   img-src data: and blob:: charts exported as images; connect-src 'self': the app's API and the
//   basemap chunk it ships; frame-ancestors 'none': no page may frame the app (clickjacking).
// The development server (HMR over a websocket, eval'd modules) gets no CSP.
import { randomBytes } from 'node:crypto'
import type { H3Event } from 'h3'

export function contentSecurityPolicy(nonce: string): string {
  return [
    `default-src 'self'`,
    `script-src 'self' 'nonce-${nonce}'`,
    `style-src 'self' 'unsafe-inline'`,
    `img-src 'self' data: blob:`,
    `font-src 'self' data:`,
    `connect-src 'self'`,
    `worker-src 'self' blob:`,
    `object-src 'none'`,
    `base-uri 'self'`,
    `form-action 'self'`,
    `frame-ancestors 'none'`,
  ].join('; ')
}

const NONCE_KEY = 'cspNonce'

function nonceOf(event: H3Event): string {
  const existing = event.context[NONCE_KEY]
  if (typeof existing === 'string') return existing
  const nonce = randomBytes(16).toString('base64')
  event.context[NONCE_KEY] = nonce
  return nonce
}

function addNonce(chunks: string[], nonce: string): string[] {
  return chunks.map(c => c.replace(/<script\b(?![^>]*\snonce=)/g, `<script nonce="${nonce}"`))
}

export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('request', (event) => {
    const headers: Record<string, string> = {
      'X-Content-Type-Options': 'nosniff',
      'X-Frame-Options': 'DENY',
      'Referrer-Policy': 'strict-origin-when-cross-origin',
      'Cross-Origin-Opener-Policy': 'same-origin',
      'Permissions-Policy': 'camera=(), microphone=(), geolocation=(), payment=()',
    }
    if (!import.meta.dev) headers['Content-Security-Policy'] = contentSecurityPolicy(nonceOf(event))
    for (const [name, value] of Object.entries(headers)) event.node.res.setHeader(name, value)
    event.node.res.removeHeader('X-Powered-By')
  })
  nitroApp.hooks.hook('render:html', (html, { event }) => {
    if (import.meta.dev) return
    const nonce = nonceOf(event)
    html.head = addNonce(html.head, nonce)
    html.bodyPrepend = addNonce(html.bodyPrepend, nonce)
    html.body = addNonce(html.body, nonce)
    html.bodyAppend = addNonce(html.bodyAppend, nonce)
  })
  nitroApp.hooks.hook('beforeResponse', (event) => {
    event.node.res.removeHeader('X-Powered-By')
  })
})
