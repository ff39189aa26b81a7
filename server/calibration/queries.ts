// Reading calibrations back: the list, one with its file and applications, the stored source.
import { and, desc, eq } from 'drizzle-orm'
import type { ArchivedFilter } from '../../shared/schemas/archive'
import { archivedFilter } from '../archive/records'
import { useDb } from '../db'
import { calibrationApplications, calibrationFiles, calibrations, users } from '../db/schema'
import { notFound } from '../utils/errors'

export async function listCalibrations(organisationId: string, archived: ArchivedFilter = 'hide') {
  return useDb().select({
    id: calibrations.id, kind: calibrations.kind, title: calibrations.title, createdAt: calibrations.createdAt,
    createdBy: users.name, fileName: calibrationFiles.fileName, inputs: calibrations.inputs, results: calibrations.results, archivedAt: calibrations.archivedAt,
  }).from(calibrations)
    .innerJoin(calibrationFiles, eq(calibrationFiles.id, calibrations.fileId))
    .leftJoin(users, eq(users.id, calibrations.createdBy))
    .where(and(eq(calibrations.organisationId, organisationId), archivedFilter(calibrations.archivedAt, archived)))
    .orderBy(desc(calibrations.createdAt))
}

export async function getCalibration(organisationId: string, id: string) {
  const db = useDb()
  const [row] = await db.select({
    calibration: calibrations,
    createdBy: users.name,
    file: { id: calibrationFiles.id, fileName: calibrationFiles.fileName, byteSize: calibrationFiles.byteSize, rowCount: calibrationFiles.rowCount, sha256: calibrationFiles.sha256, summary: calibrationFiles.summary, createdAt: calibrationFiles.createdAt },
  }).from(calibrations)
    .innerJoin(calibrationFiles, eq(calibrationFiles.id, calibrations.fileId))
    .leftJoin(users, eq(users.id, calibrations.createdBy))
    .where(and(eq(calibrations.id, id), eq(calibrations.organisationId, organisationId)))
  if (!row) notFound('Calibration')
  const applications = await db.select({
    id: calibrationApplications.id, target: calibrationApplications.target, assumptionVersionId: calibrationApplications.assumptionVersionId,
    values: calibrationApplications.values, createdAt: calibrationApplications.createdAt, appliedBy: users.name,
  }).from(calibrationApplications)
    .leftJoin(users, eq(users.id, calibrationApplications.appliedBy))
    .where(eq(calibrationApplications.calibrationId, id))
    .orderBy(desc(calibrationApplications.createdAt))
  return { ...row.calibration, createdBy: row.createdBy, file: row.file, applications }
}

export async function listLightningFiles(organisationId: string) {
  return useDb().select({
    id: calibrationFiles.id, fileName: calibrationFiles.fileName, rowCount: calibrationFiles.rowCount, byteSize: calibrationFiles.byteSize,
    summary: calibrationFiles.summary, createdAt: calibrationFiles.createdAt, uploadedBy: users.name,
  }).from(calibrationFiles)
    .leftJoin(users, eq(users.id, calibrationFiles.uploadedBy))
    .where(and(eq(calibrationFiles.organisationId, organisationId), eq(calibrationFiles.kind, 'lightning')))
    .orderBy(desc(calibrationFiles.createdAt))
}

export async function findSourceFile(organisationId: string, calibrationId: string) {
  const [row] = await useDb().select({ fileName: calibrationFiles.fileName, contentKey: calibrationFiles.contentKey, contentSha256: calibrationFiles.contentSha256, contentGzip: calibrationFiles.contentGzip })
    .from(calibrations)
    .innerJoin(calibrationFiles, eq(calibrationFiles.id, calibrations.fileId))
    .where(and(eq(calibrations.id, calibrationId), eq(calibrations.organisationId, organisationId)))
  if (!row) notFound('Calibration')
  return row
}
