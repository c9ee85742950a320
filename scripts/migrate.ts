// Brings the database schema up to date; with --seed also loads the demo data (idempotent).
import knex from 'knex'
import { knexConfig } from '../knexfile'

const db = knex(knexConfig())
try {
  const [, applied] = await db.migrate.latest()
  console.log(`[gridcue] migrations: ${applied.length ? applied.length + ' applied' : 'up to date'}`)
  if (process.argv.includes('--seed')) {
    await db.seed.run()
    console.log('[gridcue] demo data ready')
  }
} catch (error) {
  console.error(`[gridcue] migration failed: ${(error as Error).message}`)
  process.exitCode = 1
} finally {
  await db.destroy()
}
