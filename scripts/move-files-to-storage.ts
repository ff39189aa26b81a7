// Moves files still kept in PostgreSQL columns to object storage (server/storage/move.ts). Safe to run
// again: it moves only what has no object key yet. `npm start` runs it after the migrations.
import { closeDb } from '../server/db/index'
import { moveFilesToStorage } from '../server/storage/move'

const { moved } = await moveFilesToStorage()
if (moved > 0) console.log(`[files] moved ${moved} stored file${moved === 1 ? '' : 's'} to object storage`)
await closeDb()
