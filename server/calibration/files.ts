// Where a calibration's file lives: gzip-compressed in object storage (server/storage/objects.ts),
// the row keeping the object's key, size and SHA-256. Rows from before object storage keep their
// bytes until scripts/move-files-to-storage.ts moves them; they are read from the row meanwhile.
import type { Readable } from 'node:stream'
import { deleteObject, getObjectBuffer, getObjectStream, newObjectKey, putObject } from '../storage/objects'
import { storedFileStream } from './lightning-files'
import { createGunzip } from 'node:zlib'

export interface StoredContent { contentKey: string | null, contentSha256: string | null, contentGzip: Buffer | null }

export function calibrationContentKey(organisationId: string): string {
  return newObjectKey(`calibration-files/${organisationId}`)
}

/** Stores the compressed file; the caller inserts the row after, and calls `forgetCalibrationContent` if that fails. */
export async function storeCalibrationContent(organisationId: string, gzip: Buffer) {
  const stored = await putObject(calibrationContentKey(organisationId), gzip, 'application/gzip')
  return { contentKey: stored.key, contentSize: stored.sizeBytes, contentSha256: stored.sha256 }
}

/** Removes an object no row points at; an error here leaves an unreferenced object, never a row without its file. */
export async function forgetCalibrationContent(key: string): Promise<void> {
  await deleteObject(key).catch(() => {})
}

/** The compressed file, checked against its SHA-256. */
export async function calibrationContent(row: StoredContent): Promise<Buffer> {
  if (row.contentKey) return await getObjectBuffer(row.contentKey, row.contentSha256 ?? undefined)
  if (row.contentGzip) return row.contentGzip
  throw new Error('A calibration file has neither an object key nor bytes.')
}

/** The original (uncompressed) file as a stream, for downloads. */
export async function calibrationContentStream(row: StoredContent): Promise<Readable> {
  if (row.contentKey) return (await getObjectStream(row.contentKey)).pipe(createGunzip())
  if (row.contentGzip) return storedFileStream(row.contentGzip)
  throw new Error('A calibration file has neither an object key nor bytes.')
}
