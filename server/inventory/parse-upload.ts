// Reads and validates an uploaded inventory file (workbook → raw sheets → validated rows), as run on
// an upload thread (parse-thread.mjs, parse-pool.ts). Pure: no database, no Nitro.
import { validateFile, type ValidatedFile } from './rows'
import { ImportFileError, readInventoryFile } from './workbook'

export interface ParseTask { data: Uint8Array, fileName: string }

export type ParseOutcome =
  | { ok: true, file: ValidatedFile }
  | { ok: false, status: 400 | 413, message: string }

export async function parseUpload(task: ParseTask): Promise<ParseOutcome> {
  try {
    const data = Buffer.from(task.data.buffer, task.data.byteOffset, task.data.byteLength)
    return { ok: true, file: validateFile(await readInventoryFile(data, task.fileName)) }
  } catch (error) {
    if (error instanceof ImportFileError) return { ok: false, status: error.status, message: error.message }
    throw error
  }
}
