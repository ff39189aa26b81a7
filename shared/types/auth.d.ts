// The shape of the sealed session cookie (nuxt-auth-utils).
declare module '#auth-utils' {
  interface User {
    id: string
    email: string
    name: string
  }
  interface UserSession {
    /** The organisation the person is working in now, and their role there. */
    organisationId?: string
    role?: 'admin' | 'analyst' | 'underwriter' | 'asset_manager' | 'viewer'
    /** Matches users.session_version; a password reset bumps it and ends older sessions. */
    sessionVersion?: number
    /** The user_sessions row checked on every request; sign-out revokes it. */
    sessionId?: string
    loggedInAt?: number
    // Added by server/plugins/session-check.ts when the app reads the session (never stored in the
    // cookie): read from the database, so a changed role or a new membership shows at once.
    organisationName?: string
    organisationKind?: 'insurer' | 'broker' | 'operator' | 'consultancy'
    currency?: string
    memberships?: { organisationId: string, organisationName: string, kind: 'insurer' | 'broker' | 'operator' | 'consultancy', role: 'admin' | 'analyst' | 'underwriter' | 'asset_manager' | 'viewer' }[]
    /** True when mail goes to the local fake, so Admin → Mailbox has something to show. */
    mailboxEnabled?: boolean
  }
}

export {}
