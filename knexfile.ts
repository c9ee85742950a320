import { fileURLToPath } from 'node:url'
import type { Knex } from 'knex'
import { databaseUrl } from './server/config'

/** One knex configuration for the app, the migration script and the tests. */
export function knexConfig(url: string = databaseUrl()): Knex.Config {
  return {
    client: 'pg',
    connection: url,
    pool: { min: 0, max: 10 },
    migrations: { directory: fileURLToPath(new URL('./migrations', import.meta.url)), extension: 'ts', loadExtensions: ['.ts'] },
    seeds: { directory: fileURLToPath(new URL('./seeds', import.meta.url)), extension: 'ts', loadExtensions: ['.ts'] },
  }
}

export default knexConfig
