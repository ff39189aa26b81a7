// Moves files kept in PostgreSQL before object storage (inventory_imports.file_data,
// calibration_files.content_gzip) to the object
// store. Idempotent: takes rows whose key is still null, stores the bytes, reads them back and checks
// the SHA-256, and only then records the key and clears the bytes. Run by scripts/move-files-to-storage.ts
// (which `npm start` runs after the migrations, once the object store is up).
import { and, eq, isNotNull, isNull } from 'drizzle-orm'
import { useDb } from '../db'
import { calibrationFiles, inventoryImports } from '../db/schema'
import { calibrationContentKey } from '../calibration/files'
import { importFileKey } from '../inventory/files'
import { deleteObject, getObjectBuffer, putObject, sha256Hex } from './objects'

/** Stores the bytes, reads them back and checks the SHA-256; answers the stored object. */
async function storeChecked(key: string, data: Buffer, contentType: string, what: string) {
  const sha256 = sha256Hex(data)
  const stored = await putObject(key, data, contentType)
  const back = await getObjectBuffer(stored.key)
  if (sha256Hex(back) !== sha256) {
    await deleteObject(stored.key)
    throw new Error(`The copy of ${what} in object storage does not match its SHA-256; its bytes stay in the database.`)
  }
  return stored
}

export async function moveFilesToStorage(batch = 20): Promise<{ moved: number }> {
  const imports = await moveImportFilesToStorage(batch)
  const calibration = await moveCalibrationFilesToStorage(batch)
  return { moved: imports.moved + calibration.moved }
}

export async function moveCalibrationFilesToStorage(batch = 20): Promise<{ moved: number }> {
  const db = useDb()
  let moved = 0
  for (;;) {
    const rows = await db.select({ id: calibrationFiles.id, organisationId: calibrationFiles.organisationId, contentGzip: calibrationFiles.contentGzip })
      .from(calibrationFiles).where(and(isNull(calibrationFiles.contentKey), isNotNull(calibrationFiles.contentGzip))).limit(batch)
    if (rows.length === 0) return { moved }
    for (const row of rows) {
      const stored = await storeChecked(calibrationContentKey(row.organisationId), row.contentGzip!, 'application/gzip', `calibration file ${row.id}`)
      const updated = await db.update(calibrationFiles).set({ contentKey: stored.key, contentSize: stored.sizeBytes, contentSha256: stored.sha256, contentGzip: null })
        .where(and(eq(calibrationFiles.id, row.id), isNull(calibrationFiles.contentKey))).returning({ id: calibrationFiles.id })
      if (updated.length === 0) await deleteObject(stored.key)
      else moved++
    }
  }
}

export async function moveImportFilesToStorage(batch = 20): Promise<{ moved: number }> {
  const db = useDb()
  let moved = 0
  for (;;) {
    const rows = await db.select({ id: inventoryImports.id, organisationId: inventoryImports.organisationId, contentType: inventoryImports.contentType, fileData: inventoryImports.fileData })
      .from(inventoryImports).where(and(isNull(inventoryImports.fileKey), isNotNull(inventoryImports.fileData))).limit(batch)
    if (rows.length === 0) return { moved }
    for (const row of rows) {
      const data = row.fileData!
      const stored = await storeChecked(importFileKey(row.organisationId), data, row.contentType, `inventory import ${row.id}`)
      const updated = await db.update(inventoryImports).set({ fileKey: stored.key, fileSha256: stored.sha256, sizeBytes: data.length, fileData: null })
        .where(and(eq(inventoryImports.id, row.id), isNull(inventoryImports.fileKey))).returning({ id: inventoryImports.id })
      // Moved meanwhile by another run: this copy is not referenced, so it goes.
      if (updated.length === 0) await deleteObject(stored.key)
      else moved++
    }
  }
}
