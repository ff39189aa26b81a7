// The one place that talks to object storage (S3-compatible, through the AWS SDK). Uploaded files
// live there; the database keeps each file's object key, size and SHA-256. With no bucket
// configured, the local S3 fake (server/storage/fake-s3.ts) answers on loopback.
import { createHash, randomUUID } from 'node:crypto'
import type { Readable } from 'node:stream'
import { DeleteObjectCommand, GetObjectCommand, HeadObjectCommand, NoSuchKey, NotFound, PutObjectCommand, S3Client } from '@aws-sdk/client-s3'
import { settings } from '../settings'
import { AppError } from '../utils/errors'

let client: S3Client | null = null

function s3(): S3Client {
  if (client) return client
  const o = settings.objects
  client = new S3Client({
    region: o.region,
    endpoint: o.endpoint,
    forcePathStyle: o.forcePathStyle,
    // The fake accepts any key pair; a real bucket takes credentials from the SDK's usual environment.
    ...(o.fake ? { credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' } } : {}),
    maxAttempts: 2,
    // An unreachable or hung store answers 503 within seconds instead of holding the request.
    requestHandler: { connectionTimeout: settings.objects.timeoutMs, requestTimeout: settings.objects.timeoutMs, throwOnRequestTimeout: true },
  })
  return client
}

/** The answer when the store cannot be reached: 503 with words a person can act on. */
export class ObjectStoreUnavailable extends AppError {
  // Kept as `reason`, not `cause`: h3 answers with an error's cause when it has one.
  constructor(readonly reason: unknown) {
    super(503, 'File storage is not reachable just now; nothing was changed. Try again in a few minutes, or ask your administrator to check the object store.')
  }
}

function missing(error: unknown): boolean {
  return error instanceof NoSuchKey || error instanceof NotFound || (error as { name?: string })?.name === 'NoSuchKey' || (error as { $metadata?: { httpStatusCode?: number } })?.$metadata?.httpStatusCode === 404
}

async function call<T>(work: () => Promise<T>): Promise<T> {
  try {
    return await work()
  }
  catch (error) {
    if (missing(error)) throw new AppError(404, 'The stored file was not found in file storage.')
    throw new ObjectStoreUnavailable(error)
  }
}

export function sha256Hex(data: Buffer): string {
  return createHash('sha256').update(data).digest('hex')
}

export interface StoredObject { key: string, sizeBytes: number, sha256: string }

/** A new key under a prefix (e.g. `inventory-imports/<organisation>`): never reused, never guessable from the name. */
export function newObjectKey(prefix: string): string {
  return `${prefix.replace(/\/+$/, '')}/${randomUUID()}`
}

/** Stores the bytes under the key and answers with key, size and SHA-256 (the store checks it too). */
export async function putObject(key: string, data: Buffer, contentType = 'application/octet-stream'): Promise<StoredObject> {
  const sha256 = sha256Hex(data)
  await call(() => s3().send(new PutObjectCommand({
    Bucket: settings.objects.bucket, Key: key, Body: data, ContentType: contentType, ContentLength: data.length,
    Metadata: { sha256 },
  })))
  return { key, sizeBytes: data.length, sha256 }
}

/** The object as a stream (for downloads: never held whole in memory). */
export async function getObjectStream(key: string): Promise<Readable> {
  const answer = await call(() => s3().send(new GetObjectCommand({ Bucket: settings.objects.bucket, Key: key })))
  return answer.Body as Readable
}

/** The whole object; when `sha256` is given, a copy that does not match it is refused. */
export async function getObjectBuffer(key: string, sha256?: string): Promise<Buffer> {
  const stream = await getObjectStream(key)
  const chunks: Buffer[] = []
  try {
    for await (const chunk of stream) chunks.push(Buffer.from(chunk as Uint8Array))
  }
  catch (error) {
    throw new ObjectStoreUnavailable(error)
  }
  const data = Buffer.concat(chunks)
  if (sha256 && sha256Hex(data) !== sha256) throw new AppError(500, 'The stored file does not match its recorded SHA-256; it was not used.')
  return data
}

/** Size and recorded SHA-256 of an object, or null when there is none under the key. */
export async function headObject(key: string): Promise<{ sizeBytes: number, sha256: string | null } | null> {
  try {
    const answer = await s3().send(new HeadObjectCommand({ Bucket: settings.objects.bucket, Key: key }))
    return { sizeBytes: answer.ContentLength ?? 0, sha256: answer.Metadata?.sha256 ?? null }
  }
  catch (error) {
    if (missing(error)) return null
    throw new ObjectStoreUnavailable(error)
  }
}

/** Removes an object (no error when it is gone already). */
export async function deleteObject(key: string): Promise<void> {
  await call(() => s3().send(new DeleteObjectCommand({ Bucket: settings.objects.bucket, Key: key })))
}
