// Every table, by domain. drizzle-kit reads this file; so does the `db` accessor.
export * from './accounts'
export * from './audit'
export * from './mail'
export * from './system'
export * from './inventory'
export * from './runs'
export * from './insurance'
