// Where an inventory import's original file lives: object storage (server/storage/objects.ts), the
// row keeping its key, size and SHA-256. Rows from before object storage keep their bytes until
// scripts/move-files-to-storage.ts moves them; they are read from the row meanwhile.
import { deleteObject, getObjectBuffer, newObjectKey, putObject, type StoredObject } from '../storage/objects'

export function importFileKey(organisationId: string): string {
  return newObjectKey(`inventory-imports/${organisationId}`)
}

/** Stores an upload's bytes; the caller inserts the row after, and calls `forgetImportFile` if that fails. */
export async function storeImportFile(organisationId: string, data: Buffer, contentType: string): Promise<StoredObject> {
  return await putObject(importFileKey(organisationId), data, contentType)
}

/** Removes an object no row points at (a row insert that failed after the put); an error here leaves an unreferenced object, never a row without its file. */
export async function forgetImportFile(key: string): Promise<void> {
  await deleteObject(key).catch(() => {})
}

/** The original bytes of an import, re-read from storage and checked against the stored SHA-256. */
export async function importFileBytes(record: { fileKey: string | null, fileSha256: string | null, fileData: Buffer | null }): Promise<Buffer> {
  if (record.fileKey) return await getObjectBuffer(record.fileKey, record.fileSha256 ?? undefined)
  if (record.fileData) return record.fileData
  throw new Error('An inventory import has neither an object key nor bytes.')
}
