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
    loggedInAt?: number
  }
}

export {}
