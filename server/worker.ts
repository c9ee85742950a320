import { loadConfig } from './config'
import { createDb } from './db/knex'
import { startJobs } from './jobs'
import { wordSources } from './jobs/word-sources'
import { createLogger } from './logger'
import { createStorage } from './storage'

// A process that only works alignment jobs (`npm run worker`), beside servers started with
// JOBS_IN_SERVER=false: recognition then never shares a machine's cores with requests.

let config
try {
  config = loadConfig()
} catch (error) {
  process.stderr.write(`${(error as Error).message}\n`)
  process.exit(1)
}

const logger = createLogger(config.log.level)
const db = createDb(config.db.url, { timeoutMs: config.db.timeoutMs, poolMax: config.db.poolMax, logger })
const jobs = startJobs({ url: config.db.url, workers: config.jobs.workers, db, logger, words: wordSources(createStorage(config.storage)) })
process.stdout.write(`\n  Gridcue worker: alignment jobs, ${config.jobs.workers} at a time. Ctrl-C stops it (running jobs are queued again).\n\n`)

async function shutdown(signal: string) {
  logger.info({ signal }, 'worker shutting down')
  await jobs.stop()
  await db.destroy()
  process.exit(0)
}
process.on('SIGINT', () => void shutdown('SIGINT'))
process.on('SIGTERM', () => void shutdown('SIGTERM'))
process.on('unhandledRejection', (reason) => logger.error({ err: reason }, 'unhandled rejection'))
