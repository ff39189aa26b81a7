// The API token expiry rule (shared/schemas/auth.ts): a UTC calendar day after today, at most one
// year (365 days) ahead; the form proposes 90 days. Boundaries hand-worked from the rule.
import { afterEach, describe, expect, it, vi } from 'vitest'
import { apiTokenDefaultExpiry, apiTokenExpirySchema, createApiTokenSchema } from '../../shared/schemas/auth'

afterEach(() => { vi.useRealTimers() })

describe('API token expiry', () => {
  it('accepts tomorrow and the day 365 days ahead, refuses today, the past and 366 days ahead', () => {
    vi.useFakeTimers({ now: new Date('2026-03-14T09:05:00Z') })
    expect(apiTokenExpirySchema.safeParse('2026-03-15').success).toBe(true) // tomorrow (hand-worked)
    expect(apiTokenExpirySchema.safeParse('2027-03-14').success).toBe(true) // 2026-03-14 + 365 days (2027 is no leap year)
    expect(apiTokenExpirySchema.safeParse('2027-03-15').success).toBe(false) // 366 days ahead
    expect(apiTokenExpirySchema.safeParse('2026-03-13').success).toBe(false) // yesterday
    // Today still ends at 23:59:59 UTC, after now: a token for the rest of today is allowed (hand-worked).
    expect(apiTokenExpirySchema.safeParse('2026-03-14').success).toBe(true)
  })

  it('refuses dates that do not exist and other formats with a message', () => {
    vi.useFakeTimers({ now: new Date('2026-01-10T00:00:00Z') })
    const bad = apiTokenExpirySchema.safeParse('2026-02-30') // February has at most 29 days (calendar)
    expect(bad.success).toBe(false)
    expect(bad.error?.issues[0]?.message).toBe('That date does not exist.')
    expect(apiTokenExpirySchema.safeParse('14/03/2026').error?.issues[0]?.message).toBe('Write the expiry as YYYY-MM-DD.')
  })

  it('proposes 90 days ahead as the default, and a token is read-write unless asked', () => {
    expect(apiTokenDefaultExpiry(Date.parse('2026-03-14T09:05:00Z'))).toBe('2026-06-12') // 17 + 30 + 31 + 12 = 90 days (hand-worked)
    vi.useFakeTimers({ now: new Date('2026-03-14T09:05:00Z') })
    expect(createApiTokenSchema.parse({ name: 'x', expiresOn: '2026-06-12' }).readOnly).toBe(false)
  })
})
