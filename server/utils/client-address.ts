// The caller's address, for throttling and the audit log.
import type { H3Event } from 'h3'
import { settings } from '../settings'

export function clientAddress(event: H3Event): string {
  return getRequestIP(event, { xForwardedFor: settings.trustProxy }) ?? 'unknown'
}
