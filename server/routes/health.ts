import { databaseAnswers, type Db } from '../db/knex'
import { HttpError } from '../errors'
import type { EndpointTable } from './endpoint'

/** A load balancer probes every few seconds: the check must answer well within its own time-out. */
const DATABASE_CHECK_MS = 1500

/** Whether this instance can serve requests: 200 `ok` with the database up, 503 `degraded` without it. */
export function healthEndpoints(api: EndpointTable, db: Db): void {
  api.addPublic({ method: 'get', path: '/health' }, async () => {
    if (await databaseAnswers(db, DATABASE_CHECK_MS)) return { status: 'ok', database: 'up' }
    throw new HttpError(503, 'database-unavailable', 'The database is not answering: reads and saves fail until it is back.', undefined, {
      status: 'degraded',
      database: 'down',
    })
  })
}
