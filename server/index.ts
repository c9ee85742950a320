import { createApp } from './app'
import { loadConfig } from './config'
import { createDb, databaseAnswers } from './db/knex'
import { demoEpisodePath } from './demo-episode'
import { startJobs } from './jobs'
import { wordSources } from './jobs/word-sources'
import { createLogger } from './logger'
import { sharedMailCatcher } from './mail/catcher'
import { resumePlaybackPreparation } from './services/recordings'
import { createStorage } from './storage'
import { createEnginePool } from './workers/engine-pool'

// start-up messages are for the person at the terminal: plain lines, not JSON log records
const say = (text: string) => process.stdout.write(`${text}\n`)
const complain = (text: string) => process.stderr.write(`${text}\n`)

let config
try {
  config = loadConfig()
} catch (error) {
  complain((error as Error).message)
  process.exit(1)
}

const logger = createLogger(config.log.level)
const db = createDb(config.db.url, { timeoutMs: config.db.timeoutMs, queryTimeoutMs: config.db.queryTimeoutMs, poolMax: config.db.poolMax, logger })
const engine = createEnginePool({ ...config.engine, logger })
const storage = createStorage(config.storage)
// alignment jobs are worked here unless JOBS_IN_SERVER=false leaves them to `npm run worker` processes
const jobs = startJobs({ url: config.db.url, workers: config.jobs.inServer ? config.jobs.workers : 0, db, logger, words: wordSources(storage) })
const app = createApp({ db, config, logger, engine, jobs: jobs.queue, storage })

// Express 5 hands a listen error to this callback as well
const server = app.listen(config.http.port, config.http.host, (error?: Error) => {
  if (error) {
    const inUse = (error as NodeJS.ErrnoException).code === 'EADDRINUSE'
    complain(inUse ? `\n  Port ${config.http.port} is already in use: stop what uses it, or set PORT to another port.\n` : `\n  Gridcue could not start: ${error.message}\n`)
    process.exit(1)
  }
  const address = server.address()
  const port = typeof address === 'object' && address ? address.port : config.http.port
  say(`\n  Gridcue is running at http://${config.http.host}:${port}/\n`)
  // without SMTP_URL mail is kept by the local catcher on loopback: started now, so a failure shows at once
  if (!config.mail.smtpUrl) {
    void sharedMailCatcher().then(
      (catcher) =>
        say(
          config.mail.caughtMailPage
            ? `  Mail is not sent (no SMTP_URL): read it at http://${config.http.host}:${port}/dev/mail\n`
            : `  Mail is not sent (no SMTP_URL): the local catcher on port ${catcher.port} keeps it; set SMTP_URL to send it\n`,
        ),
      (err: unknown) => logger.error({ err }, 'the local mail catcher could not start'),
    )
  }
  // the app starts without its database and recovers when it comes: say so rather than leave it to the first 503
  void databaseAnswers(db, config.db.timeoutMs).then((up) => {
    if (!up) {
      complain(`  The database is not answering yet: requests answer 503 until it is (/api/health reports it).\n`)
      return
    }
    // a newcomer's first stop beside the studio: the page viewers read (only where the demo data is)
    void demoEpisodePath(db).then(
      (path) => path && say(`  Demo episode: http://${config.http.host}:${port}${path}\n`),
      (err: unknown) => logger.warn({ err }, 'the demo episode could not be looked up'),
    )
    // conversions a stopped server was making start again (with the database away, at the next start)
    void resumePlaybackPreparation({ db, storage, logger }).catch((err: unknown) => logger.warn({ err }, 'conversions for playback could not resume'))
  })
})

// requests in flight (a save on its way) get this long to finish before the pools and the database close
const DRAIN_MS = 10_000

async function shutdown(signal: string) {
  logger.info({ signal }, 'shutting down')
  await new Promise<void>((resolve) => {
    server.close(() => resolve())
    server.closeIdleConnections()
    setTimeout(resolve, DRAIN_MS).unref()
  })
  await engine.destroy()
  // running alignments are stopped and queued again; that writes to the database, so it goes before it
  await jobs.stop()
  await db.destroy()
  process.exit(0)
}
process.on('SIGINT', () => void shutdown('SIGINT'))
process.on('SIGTERM', () => void shutdown('SIGTERM'))
process.on('unhandledRejection', (reason) => logger.error({ err: reason }, 'unhandled rejection'))
