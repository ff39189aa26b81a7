import { defineConfig } from 'drizzle-kit'
import { databaseUrl } from './server/db/config'

export default defineConfig({
  dialect: 'postgresql',
  schema: './server/db/schema/index.ts',
  out: './drizzle',
  casing: 'snake_case',
  dbCredentials: { url: databaseUrl() },
})
