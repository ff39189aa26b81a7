// Every table, by domain. drizzle-kit reads this file; so does the `db` accessor.
export * from './accounts'
export * from './audit'
export * from './mail'
export * from './system'
export * from './calibration'
// TEMPORARY until the merge (see the files): the lead's assumption tables and the inventory's sites.
export * from './assumptions-temp'
export * from './calibration-sites-temp'
