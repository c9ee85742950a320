import type { AddressInfo } from 'node:net'
import { afterAll, beforeAll } from 'vitest'
import type { Server } from 'node:http'
import type { Browser } from 'playwright-core'
import { launchChromium } from '../../scripts/lib/chromium'
import { createApp } from '../../server/app'
import type { Db } from '../../server/db/knex'
import { startJobs } from '../../server/jobs'
import { wordSources } from '../../server/jobs/word-sources'
import { createLogger } from '../../server/logger'
import { createStorage } from '../../server/storage'
import { testEnginePool } from './api'
import { openTestDb, resetWithDemo, testConfig } from './db'

/**
 * Serves the built client (dist/) and the API, with a one-thread engine pool, on a free loopback port; with
 * `jobs`, one worker on the alignment queue too, polling often, so a suggestion run finishes within seconds.
 */
async function serveApp(db: Db, { jobs: withJobs = false } = {}): Promise<{ url: string; close: () => Promise<void> }> {
  const engine = testEnginePool()
  const config = testConfig()
  const storage = createStorage(config.storage)
  const logger = createLogger(config.log.level)
  const jobs = startJobs({ url: config.db.url, workers: withJobs ? 1 : 0, db, logger, words: wordSources(storage), pollingIntervalSeconds: 0.5 })
  const app = createApp({ db, config, engine, storage, logger, jobs: jobs.queue })
  const server: Server = await new Promise((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s))
  })
  const { port } = server.address() as AddressInfo
  return {
    url: `http://127.0.0.1:${port}`,
    close: async () => {
      server.closeAllConnections()
      await new Promise<void>((resolve) => server.close(() => resolve()))
      await jobs.stop()
      await engine.destroy()
    },
  }
}

export interface BrowserSuite {
  db: Db
  browser: Browser
  url: string
}

/** Registers hooks that give a test file fresh demo data, the app on a free port and a Chromium; read it inside tests. */
export function useBrowserSuite(options: { jobs?: boolean } = {}): BrowserSuite {
  const suite = {} as BrowserSuite
  let server: Awaited<ReturnType<typeof serveApp>> | undefined
  beforeAll(async () => {
    suite.db = await openTestDb()
    await resetWithDemo(suite.db)
    server = await serveApp(suite.db, options)
    suite.url = server.url
    suite.browser = await launchChromium()
  })
  afterAll(async () => {
    await suite.browser?.close()
    await server?.close()
    await suite.db?.destroy()
  })
  return suite
}
