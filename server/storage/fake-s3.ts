// The local S3 fake for development, the demo and the tests: s3rver (a development dependency) on
// loopback with its files under .data/s3/, and the configured bucket created. Started by
// scripts/serve.ts (or scripts/s3-fake.ts in the tests) when no bucket is configured.
import { mkdirSync } from 'node:fs'
import { createRequire } from 'node:module'
import { resolve } from 'node:path'
import { settings } from '../settings'

/** The part of s3rver used here (it ships no types). */
interface S3rverServer { run(): Promise<unknown>, close(): Promise<void> }
type S3rverClass = new (options: { address: string, port: number, directory: string, silent: boolean, configureBuckets: { name: string, configs: unknown[] }[] }) => S3rverServer

export async function startS3Fake(root: string, port = settings.objects.fakePort): Promise<{ stop: () => Promise<void> }> {
  const directory = resolve(root, process.env.STORMLEDGER_S3_FAKE_DIR || '.data/s3')
  mkdirSync(directory, { recursive: true })
  const S3rver = createRequire(import.meta.url)('s3rver') as S3rverClass
  const server = new S3rver({ address: '127.0.0.1', port, directory, silent: true, configureBuckets: [{ name: settings.objects.bucket, configs: [] }] })
  await server.run()
  return { stop: () => server.close() }
}
