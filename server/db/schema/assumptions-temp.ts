// TEMPORARY (calibration branch only): the lead's assumption tables, copied so this branch compiles
// and tests before the merge. Deleted before the branch is merged; main's definitions replace it.
import { boolean, integer, jsonb, pgTable, text, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { organisations, users } from './accounts'
import { timestamps } from './columns'

export const assumptionSets = pgTable('assumption_sets', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  description: text('description').notNull().default(''),
  createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [uniqueIndex('assumption_sets_org_name_unique').on(t.organisationId, t.name)])

export const assumptionSetVersions = pgTable('assumption_set_versions', {
  id: uuid('id').primaryKey().defaultRandom(),
  assumptionSetId: uuid('assumption_set_id').notNull().references(() => assumptionSets.id, { onDelete: 'cascade' }),
  version: integer('version').notNull(),
  parameters: jsonb('parameters').notNull(),
  note: text('note').notNull().default(''),
  provenance: jsonb('provenance').notNull().default({}),
  usedByRun: boolean('used_by_run').notNull().default(false),
  createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [uniqueIndex('assumption_versions_set_version_unique').on(t.assumptionSetId, t.version)])
