import { availableParallelism } from 'node:os'
import { z } from 'zod'

// leave one core for the request thread; more than four engine threads only queue on PostgreSQL
const DEFAULT_ENGINE_THREADS = Math.max(1, Math.min(4, availableParallelism() - 1))

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  HOST: z.string().default('127.0.0.1'),
  PORT: z.coerce.number().int().min(0).max(65535).default(5180),
  DATABASE_URL: z
    .string({ message: 'DATABASE_URL is required (npm start sets it; or point it at your PostgreSQL)' })
    .regex(/^postgres(ql)?:\/\//, { message: 'DATABASE_URL must start with postgres:// or postgresql://' }),
  // how long a request waits for a database connection before it answers 503 (knex's own default is a minute)
  DATABASE_TIMEOUT_MS: z.coerce.number().int().min(100).max(60_000).default(3000),
  DATABASE_QUERY_TIMEOUT_MS: z.coerce.number().int().min(100).max(600_000).default(10_000),
  // connections per app instance: instances × this must stay under PostgreSQL's max_connections
  DATABASE_POOL_MAX: z.coerce.number().int().min(1).max(200).default(10),
  JWT_SECRET: z.string({ message: 'JWT_SECRET is required' }).min(32, { message: 'JWT_SECRET must be at least 32 characters' }),
  JWT_EXPIRES_IN_SECONDS: z.coerce.number().int().min(60).max(30 * 24 * 3600).default(12 * 3600),
  SIGN_IN_ATTEMPTS_PER_15_MIN: z.coerce.number().int().min(1).default(10),
  SIGN_IN_ATTEMPTS_PER_ADDRESS_PER_15_MIN: z.coerce.number().int().min(1).default(30),
  // set when one TLS-terminating proxy sits in front: only then may browsers be told to insist on https,
  // and only then is the caller's address the one the proxy passes on (X-Forwarded-For)
  BEHIND_TLS: z.stringbool().default(false),
  ENGINE_THREADS: z.coerce.number().int().min(1).max(64).default(DEFAULT_ENGINE_THREADS),
  ENGINE_TIMEOUT_MS: z.coerce.number().int().min(1000).default(30_000),
  // a cue sheet normally takes well under a second; one that runs long is stopped and the caller asked to retry
  EXPORT_TIMEOUT_MS: z.coerce.number().int().min(1000).default(10_000),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).optional(),
  // where recordings are kept: a folder on this machine, or an S3-compatible object store
  STORAGE: z.enum(['disk', 's3']).default('disk'),
  STORAGE_DIR: z.string().min(1).default('.data/recordings'),
  S3_ENDPOINT: z.url({ message: 'S3_ENDPOINT must be an address such as http://127.0.0.1:4569' }).optional(),
  S3_BUCKET: z.string().min(3).optional(),
  S3_REGION: z.string().min(1).default('us-east-1'),
  S3_ACCESS_KEY_ID: z.string().min(1).optional(),
  S3_SECRET_ACCESS_KEY: z.string().min(1).optional(),
  // one recording's upload; an hour of camera video is a few GB
  UPLOAD_MAX_BYTES: z.coerce.number().int().min(1).default(4 * 1024 ** 3),
  // alignment jobs one process works at once: speech recognition is one single-threaded child process per job
  JOB_WORKERS: z.coerce.number().int().min(1).max(16).default(1),
  // false when separate `npm run worker` processes work the jobs and this server only queues them
  JOBS_IN_SERVER: z.stringbool().default(true),
  // outgoing mail (invitations, password resets): any SMTP server; absent outside production, a local catcher takes the mail
  SMTP_URL: z.string().regex(/^smtps?:\/\//, { message: 'SMTP_URL must start with smtp:// or smtps://' }).optional(),
  MAIL_FROM: z.string().min(3).default('Gridcue <no-reply@gridcue.localhost>'),
  // the address people open Gridcue at, for links in mails (never taken from a request's Host header, which anyone can forge)
  PUBLIC_URL: z.url({ message: 'PUBLIC_URL must be an address such as https://gridcue.example.org' }).optional(),
}).refine((e) => e.STORAGE !== 's3' || e.S3_BUCKET, { message: 'S3_BUCKET is required when STORAGE=s3', path: ['S3_BUCKET'] })

export type Config = ReturnType<typeof loadConfig>

/** Reads and validates the environment once; throws with every problem listed. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env) {
  const parsed = envSchema.safeParse(env)
  if (!parsed.success) {
    const problems = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`).join('\n')
    throw new Error(`Invalid configuration:\n${problems}`)
  }
  const e = parsed.data
  return Object.freeze({
    env: e.NODE_ENV,
    http: { host: e.HOST, port: e.PORT, behindTls: e.BEHIND_TLS },
    db: { url: e.DATABASE_URL, timeoutMs: e.DATABASE_TIMEOUT_MS, queryTimeoutMs: e.DATABASE_QUERY_TIMEOUT_MS, poolMax: e.DATABASE_POOL_MAX },
    auth: {
      jwtSecret: e.JWT_SECRET,
      tokenTtlSeconds: e.JWT_EXPIRES_IN_SECONDS,
      signInAttemptsPer15Min: e.SIGN_IN_ATTEMPTS_PER_15_MIN,
      signInAttemptsPerAddressPer15Min: e.SIGN_IN_ATTEMPTS_PER_ADDRESS_PER_15_MIN,
    },
    // the worker threads: the engine's pool and the exports' pool (server/workers/engine-pool.ts)
    engine: { threads: e.ENGINE_THREADS, timeoutMs: e.ENGINE_TIMEOUT_MS, exportTimeoutMs: e.EXPORT_TIMEOUT_MS },
    log: { level: e.LOG_LEVEL ?? (e.NODE_ENV === 'test' ? 'silent' : 'info') },
    storage: storageOf(e),
    uploads: { maxBytes: e.UPLOAD_MAX_BYTES },
    jobs: { workers: e.JOB_WORKERS, inServer: e.JOBS_IN_SERVER },
    mail: mailOf(e),
  })
}

/** Where recordings go; the S3 fields without an endpoint mean the provider's own (AWS). */
function storageOf(e: z.output<typeof envSchema>) {
  if (e.STORAGE === 'disk') return { driver: 'disk' as const, dir: e.STORAGE_DIR }
  const credentials = e.S3_ACCESS_KEY_ID && e.S3_SECRET_ACCESS_KEY ? { accessKeyId: e.S3_ACCESS_KEY_ID, secretAccessKey: e.S3_SECRET_ACCESS_KEY } : undefined
  return { driver: 's3' as const, endpoint: e.S3_ENDPOINT, bucket: e.S3_BUCKET ?? '', region: e.S3_REGION, credentials }
}

/**
 * Where mail goes and what its links start with. Without SMTP_URL the local catcher (server/mail/catcher.ts)
 * keeps it, so nothing is lost; its page (/dev/mail) shows reset links to whoever opens it, so never in production.
 */
function mailOf(e: Pick<z.output<typeof envSchema>, 'SMTP_URL' | 'MAIL_FROM' | 'PUBLIC_URL' | 'HOST' | 'PORT' | 'NODE_ENV'>) {
  return {
    smtpUrl: e.SMTP_URL,
    from: e.MAIL_FROM,
    publicUrl: (e.PUBLIC_URL ?? `http://${e.HOST}:${e.PORT}`).replace(/\/+$/, ''),
    caughtMailPage: !e.SMTP_URL && e.NODE_ENV !== 'production',
  }
}

export type MailSettings = ReturnType<typeof mailOf>

/** Only the mail settings, for the mailer every service calls without being handed the whole configuration. */
export function mailSettings(env: NodeJS.ProcessEnv = process.env): MailSettings {
  const { SMTP_URL, MAIL_FROM, PUBLIC_URL, HOST, PORT, NODE_ENV } = envSchema.shape
  const mail = z.object({ SMTP_URL, MAIL_FROM, PUBLIC_URL, HOST, PORT, NODE_ENV }).safeParse(env)
  if (!mail.success) throw new Error(`Invalid configuration:\n${mail.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`).join('\n')}`)
  return mailOf(mail.data)
}

/** Only the database address, for tools (migrations, seeds) that need nothing else. */
export function databaseUrl(env: NodeJS.ProcessEnv = process.env): string {
  const url = envSchema.shape.DATABASE_URL.safeParse(env.DATABASE_URL)
  if (!url.success) throw new Error(`Invalid configuration: DATABASE_URL: ${url.error.issues[0]?.message}`)
  return url.data
}
