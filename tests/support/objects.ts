// The test app's S3 fake, read and written from a test through the app's own storage module.
import { inject } from 'vitest'

/** Points server/storage/objects.ts in this test process at the test app's S3 fake. Call before any use. */
export function useTestObjectStore(): void {
  process.env.STORMLEDGER_S3_BUCKET = ''
  process.env.STORMLEDGER_S3_FAKE_PORT = String(inject('s3Port'))
  process.env.STORMLEDGER_S3_TIMEOUT_MS = '3000'
}

/** Pauses the S3 fake (SIGSTOP): the store accepts connections but never answers, as a hung store does. */
export function pauseObjectStore(): void {
  process.kill(inject('s3FakePid'), 'SIGSTOP')
}

export function resumeObjectStore(): void {
  process.kill(inject('s3FakePid'), 'SIGCONT')
}
