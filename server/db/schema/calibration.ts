// Calibration from data (MODEL.md §7): the uploaded source files, the calibrations made from them,
// and every time a calibration was turned into assumptions or site flash densities.
import { sql } from 'drizzle-orm'
import { bigint, check, customType, index, integer, jsonb, pgEnum, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import { organisations, users } from './accounts'
import { timestamps } from './columns'

const bytea = customType<{ data: Buffer, driverData: Buffer }>({ dataType: () => 'bytea' })

export const calibrationKind = pgEnum('calibration_kind', ['lightning', 'impulse', 'storm_clustering'])
export const calibrationTarget = pgEnum('calibration_target', ['assumption_version', 'site_flash_density'])

/** A source file exactly as uploaded (or, for a series typed in, as written back to CSV), gzip-compressed. */
export const calibrationFiles = pgTable('calibration_files', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  kind: calibrationKind('kind').notNull(),
  fileName: text('file_name').notNull(),
  /** Size of the original (uncompressed) file. */
  byteSize: bigint('byte_size', { mode: 'number' }).notNull(),
  rowCount: integer('row_count').notNull(),
  sha256: text('sha256').notNull(),
  /** Legacy copy of the gzip-compressed file; emptied once scripts/move-files-to-storage.ts has moved it to object storage. */
  contentGzip: bytea('content_gzip'),
  /** The gzip-compressed file in object storage (server/storage/objects.ts): key, size and SHA-256 of the stored object. */
  contentKey: text('content_key'),
  contentSize: bigint('content_size', { mode: 'number' }),
  contentSha256: text('content_sha256'),
  /** Lightning: record counts by type and polarity, time span, extent. Impulse: applications and sparks. */
  summary: jsonb('summary').notNull(),
  uploadedBy: uuid('uploaded_by').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [
  index('calibration_files_org_created_idx').on(t.organisationId, t.createdAt),
  index('calibration_files_uploaded_by_idx').on(t.uploadedBy),
  check('calibration_files_name_present', sql`length(${t.fileName}) > 0`),
  check('calibration_files_sizes', sql`${t.byteSize} >= 0 AND ${t.rowCount} >= 0`),
  check('calibration_files_content_kept', sql`${t.contentKey} IS NOT NULL OR ${t.contentGzip} IS NOT NULL`),
])

/** One calibration: its inputs, its results (with methods and intervals) and the file it came from. */
export const calibrations = pgTable('calibrations', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  kind: calibrationKind('kind').notNull(),
  title: text('title').notNull(),
  /** The source stays as long as a calibration made from it. */
  fileId: uuid('file_id').notNull().references(() => calibrationFiles.id, { onDelete: 'restrict' }),
  inputs: jsonb('inputs').notNull(),
  results: jsonb('results').notNull(),
  createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
  /** Archived: hidden from lists and pickers by default, kept for what used it (null: in use). */
  archivedAt: timestamp('archived_at', { withTimezone: true }),
  archivedBy: uuid('archived_by').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [
  index('calibrations_org_created_idx').on(t.organisationId, t.createdAt),
  index('calibrations_org_archived_idx').on(t.organisationId, t.archivedAt),
  index('calibrations_archived_by_idx').on(t.archivedBy),
  index('calibrations_file_idx').on(t.fileId),
  index('calibrations_created_by_idx').on(t.createdBy),
  check('calibrations_title_present', sql`length(${t.title}) > 0`),
])

/**
 * A calibration turned into a new assumption-set version or into site flash densities. The version
 * id is kept without a foreign key: versions are immutable and this row is a record of provenance.
 */
export const calibrationApplications = pgTable('calibration_applications', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  calibrationId: uuid('calibration_id').notNull().references(() => calibrations.id, { onDelete: 'cascade' }),
  target: calibrationTarget('target').notNull(),
  assumptionVersionId: uuid('assumption_version_id'),
  /** What was written: parameter keys or site ids with the values. */
  values: jsonb('values').notNull(),
  appliedBy: uuid('applied_by').references(() => users.id, { onDelete: 'set null' }),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [
  index('calibration_applications_calibration_idx').on(t.calibrationId),
  index('calibration_applications_org_idx').on(t.organisationId, t.createdAt),
  index('calibration_applications_applied_by_idx').on(t.appliedBy),
  index('calibration_applications_version_idx').on(t.assumptionVersionId),
  check('calibration_applications_version_when_needed', sql`(${t.target} = 'assumption_version') = (${t.assumptionVersionId} IS NOT NULL)`),
])
