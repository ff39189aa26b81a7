// Settings read from the environment, shared by the web server, the worker and the scripts.
// README.md "Configuration" lists every variable with its default.

function flag(name: string, fallback: boolean): boolean {
  const v = process.env[name]
  if (v === undefined || v === '') return fallback
  return ['1', 'true', 'yes', 'on'].includes(v.toLowerCase())
}

export const settings = {
  /** The address people open; used in e-mailed links. */
  get publicUrl() { return (process.env.STORMLEDGER_PUBLIC_URL ?? `http://localhost:${process.env.PORT ?? 3000}`).replace(/\/$/, '') },
  get mail() {
    const realSmtp = Boolean(process.env.SMTP_HOST)
    return {
      /** With no SMTP_HOST, mail goes to the local capturing fake (development, tests, demo). */
      captured: !realSmtp,
      host: process.env.SMTP_HOST ?? '127.0.0.1',
      port: Number(process.env.SMTP_PORT ?? (realSmtp ? 587 : process.env.STORMLEDGER_MAIL_FAKE_PORT ?? 2525)),
      secure: flag('SMTP_SECURE', false),
      user: process.env.SMTP_USER ?? '',
      password: process.env.SMTP_PASSWORD ?? '',
      from: process.env.MAIL_FROM ?? 'Stormledger <no-reply@stormledger.invalid>',
    }
  },
  /**
   * Take the client address from X-Forwarded-For (set only behind a reverse proxy that overwrites
   * it); otherwise the address of the connection. Sign-in throttling counts failures per address.
   */
  get trustProxy() { return flag('STORMLEDGER_TRUST_PROXY', false) },
  /** Worker threads per worker process; defaults to every core. */
  get workerThreads() { return Number(process.env.STORMLEDGER_WORKER_THREADS ?? 0) || undefined },
  /** Threads of the web server that read uploaded inventory files (server/inventory/parse-pool.ts). */
  get uploadThreads() { return Number(process.env.STORMLEDGER_UPLOAD_THREADS ?? 0) || 2 },
  /** Seconds between a working chunk's heartbeats, and after how many seconds without one it is reclaimed. */
  get heartbeatSeconds() { return Number(process.env.STORMLEDGER_HEARTBEAT_SECONDS ?? 0) || 2 },
  /**
   * Object storage for uploaded files. With no STORMLEDGER_S3_BUCKET, files go to the local S3 fake
   * (s3rver on loopback, files under .data/s3/) that `npm start` and the tests start.
   */
  get objects() {
    const real = Boolean(process.env.STORMLEDGER_S3_BUCKET)
    const fakePort = Number(process.env.STORMLEDGER_S3_FAKE_PORT ?? 4569)
    return {
      fake: !real,
      fakePort,
      bucket: process.env.STORMLEDGER_S3_BUCKET || 'stormledger-files',
      region: process.env.STORMLEDGER_S3_REGION || process.env.AWS_REGION || 'us-east-1',
      endpoint: real ? (process.env.STORMLEDGER_S3_ENDPOINT || undefined) : `http://127.0.0.1:${fakePort}`,
      /** Path-style addressing (bucket in the path) for S3-compatible stores other than AWS. */
      /** Milliseconds to wait for the store before a request answers 503. */
      timeoutMs: Number(process.env.STORMLEDGER_S3_TIMEOUT_MS ?? 0) || 15_000,
      forcePathStyle: real ? flag('STORMLEDGER_S3_PATH_STYLE', Boolean(process.env.STORMLEDGER_S3_ENDPOINT)) : true,
    }
  },
  get staleAfterSeconds() { return Number(process.env.STORMLEDGER_STALE_AFTER_SECONDS ?? 0) || 20 },
}
