// The local S3 fake on its own (server/storage/fake-s3.ts), until SIGTERM. The tests run it as a
// separate process (so a test can make the store unreachable); `npm start` runs it inside scripts/serve.ts.
import { resolve } from 'node:path'
import { settings } from '../server/settings'
import { startS3Fake } from '../server/storage/fake-s3'

const fake = await startS3Fake(resolve(import.meta.dirname, '..'))
console.log(`[s3 fake] ready on 127.0.0.1:${settings.objects.fakePort} (pid ${process.pid})`)
const stop = () => void fake.stop().finally(() => process.exit(0))
process.on('SIGTERM', stop)
process.on('SIGINT', stop)
