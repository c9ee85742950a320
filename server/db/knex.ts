import knex, { type Knex } from 'knex'
import { knexConfig } from '../../knexfile'

export type Db = Knex

export interface DbOptions {
  /** how long a query waits for a connection (to connect, or for a free one in the pool) before it fails */
  timeoutMs?: number
  /** how long a sent query waits for its answer: a frozen server (or a lost route) otherwise holds the request for ever */
  queryTimeoutMs?: number
  /** the most connections one process holds; every app instance counts against PostgreSQL's max_connections */
  poolMax?: number
  /** where knex's own warnings go (a dropped connection, a failed connect); the console when absent */
  logger?: { warn: (message: string) => void }
}

/** Knex waits a minute for a connection by default: a request would hang that long while the database is down. */
const DEFAULT_TIMEOUT_MS = 3000
/** Longer than any query of ours takes on a working server (the slowest, a migration, runs outside the app). */
const DEFAULT_QUERY_TIMEOUT_MS = 10_000

/** The app's one knex instance; it fails fast while the database is away and reconnects by itself when it is back. */
export function createDb(url: string, { timeoutMs = DEFAULT_TIMEOUT_MS, queryTimeoutMs = DEFAULT_QUERY_TIMEOUT_MS, poolMax, logger }: DbOptions = {}): Db {
  const base = knexConfig(url)
  return knex({
    ...base,
    connection: { connectionString: url, connectionTimeoutMillis: timeoutMs, query_timeout: queryTimeoutMs, keepAlive: true },
    acquireConnectionTimeout: timeoutMs,
    // propagateCreateError (knex's default, kept here): a refused connection fails the waiting query at
    // once instead of being retried until the timeout
    pool: { ...base.pool, max: poolMax ?? base.pool?.max, propagateCreateError: true },
    ...(logger && { log: knexLog(logger) }),
  })
}

function knexLog(logger: NonNullable<DbOptions['logger']>): Knex.Config['log'] {
  const warn = (message: string) => logger.warn(message)
  return { warn, error: warn, deprecate: warn, debug: () => {} }
}

/** Whether the database answers a trivial query within `timeoutMs`; never throws. */
export async function databaseAnswers(db: Db, timeoutMs: number): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined
  const late = new Promise<false>((resolve) => (timer = setTimeout(() => resolve(false), timeoutMs)))
  try {
    return await Promise.race([db.raw('select 1').then(() => true), late])
  } catch {
    return false
  } finally {
    clearTimeout(timer)
  }
}

// Node's socket errors and PostgreSQL's SQLSTATEs for "the server is not there": class 08 (connection
// exception) is matched by prefix; 57P01–57P03 are an administrator's shutdown, a crash and "starting up /
// shutting down"; 53300 is "too many connections".
const UNAVAILABLE_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH', 'ENETUNREACH', 'ENOTFOUND', 'EAI_AGAIN', '57P01', '57P02', '57P03', '53300'])
// node-postgres raises these without a code when a connection drops or never answers; knex puts the SQL in
// front of the message, so they are matched anywhere in it
const UNAVAILABLE_MESSAGES = /Query read timeout|Connection terminated|connection error and is not queryable|Client was closed and is not queryable|Connection ended unexpectedly/

/**
 * Whether an error means the database could not be reached or dropped the connection (as opposed to a
 * query it refused): a stopped, restarting or unreachable server, or no pooled connection within the timeout.
 */
export function isConnectionFailure(error: unknown): boolean {
  if (typeof error !== 'object' || error === null) return false
  const e = error as { name?: unknown; code?: unknown; message?: unknown; errors?: unknown }
  // knex's own class for "no connection within acquireConnectionTimeout"
  if (e.name === 'KnexTimeoutError') return true
  if (typeof e.code === 'string' && (UNAVAILABLE_CODES.has(e.code) || /^08[0-9A-Z]{3}$/.test(e.code))) return true
  if (typeof e.message === 'string' && UNAVAILABLE_MESSAGES.test(e.message)) return true
  // a host name with several addresses fails with one error per address
  return Array.isArray(e.errors) && e.errors.length > 0 && e.errors.every(isConnectionFailure)
}
