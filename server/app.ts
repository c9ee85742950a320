import { existsSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import express, { type Express } from 'express'
import helmet from 'helmet'
import { pinoHttp } from 'pino-http'
import { createPassport } from './auth/passport'
import type { Config } from './config'
import type { Db } from './db/knex'
import { createLogger, type AppLogger } from './logger'
import { errorHandler, unknownRoute } from './middleware/error-handler'
import { authEndpoints } from './routes/auth'
import { channelEndpoints } from './routes/channels'
import { endpointTable } from './routes/endpoint'
import { healthEndpoints } from './routes/health'
import { outlineEndpoints } from './routes/outlines'
import { puzzleEndpoints } from './routes/puzzles'
import { createEnginePool, type EnginePool } from './workers/engine-pool'

export interface AppDeps {
  db: Db
  config: Config
  logger?: AppLogger
  /** the engine's worker pool; whoever creates it destroys it on shutdown (threads start on first use) */
  engine?: EnginePool
  /** folder with the built client; served with a fallback to index.html for client-side routes */
  clientDir?: string
}

const DEFAULT_CLIENT_DIR = fileURLToPath(new URL('../dist', import.meta.url))

/** Builds the Express app without listening, so tests can drive it with supertest. */
export function createApp({ db, config, logger, engine, clientDir = DEFAULT_CLIENT_DIR }: AppDeps): Express {
  const app = express()
  logger ??= createLogger(config.log.level)
  engine ??= createEnginePool({ ...config.engine, logger })
  const passport = createPassport(db, config.auth.jwtSecret)

  app.disable('x-powered-by')
  // served over plain http on loopback, so no upgrade of sub-requests to https
  app.use(helmet({ contentSecurityPolicy: { directives: { upgradeInsecureRequests: null } } }))
  app.use(
    pinoHttp({
      logger,
      autoLogging: { ignore: (req) => !req.url?.startsWith('/api') },
      // one short line per request: never headers (they carry tokens)
      serializers: {
        req: (req: { id: unknown; method: string; url: string }) => ({ id: req.id, method: req.method, url: req.url }),
        res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
      },
    }),
  )
  app.use(express.json({ limit: '1mb' }))

  // the route table: every API endpoint goes through it, so listEndpoints(app) knows them all
  const api = endpointTable(app, '/api', { db, passport })
  authEndpoints(api, db, config)
  channelEndpoints(api, db)
  puzzleEndpoints(api, db, engine)
  outlineEndpoints(api, db, engine)
  healthEndpoints(api, db)
  app.use('/api', unknownRoute)

  if (existsSync(clientDir)) {
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }))
    app.get('/{*splat}', (_req, res) => res.sendFile('index.html', { root: clientDir }))
  }
  app.use(unknownRoute)
  app.use(errorHandler)
  return app
}
