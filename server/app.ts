// first: zod's settings apply to schemas as they are built, and the imports below build them
import '../shared/schemas/zod-config'
import { existsSync } from 'node:fs'
import { join, resolve, sep } from 'node:path'
import { fileURLToPath } from 'node:url'
import express, { type Express, type Response } from 'express'
import helmet from 'helmet'
import { pinoHttp } from 'pino-http'
import { episodeGrants } from './auth/episode-grants'
import { mediaTokens } from './auth/media-tokens'
import { createPassport } from './auth/passport'
import type { Config } from './config'
import type { Db } from './db/knex'
import { createLogger, type AppLogger } from './logger'
import { errorHandler, unknownRoute } from './middleware/error-handler'
import { authEndpoints } from './routes/auth'
import { accountEndpoints } from './routes/account'
import { devMailEndpoints } from './routes/dev-mail'
import { invitationEndpoints } from './routes/invitations'
import { memberEndpoints } from './routes/members'
import { channelEndpoints } from './routes/channels'
import { episodeEndpoints } from './routes/episodes'
import { endpointTable } from './routes/endpoint'
import { healthEndpoints } from './routes/health'
import { alignmentEndpoints } from './routes/alignments'
import { outlineEndpoints } from './routes/outlines'
import { pipelineEndpoints } from './routes/pipeline'
import { pictureEndpoints } from './routes/pictures'
import { puzzleEndpoints } from './routes/puzzles'
import { recordingEndpoints } from './routes/recordings'
import { rehearsalEndpoints } from './routes/rehearsals'
import { createStorage, type Storage } from './storage'
import { createEnginePool, type EnginePool } from './workers/engine-pool'
import { createJobQueue, type AlignmentQueue } from './jobs/queue'

export interface AppDeps {
  db: Db
  config: Config
  logger?: AppLogger
  /** the engine's worker pool; whoever creates it destroys it on shutdown (threads start on first use) */
  engine?: EnginePool
  /** the job queue alignment runs go on; whoever creates it stops it (it connects on first use) */
  jobs?: AlignmentQueue
  /** where recordings are kept; the configured driver when absent */
  storage?: Storage
  /** folder with the built client; served with a fallback to index.html for client-side routes */
  clientDir?: string
}

const DEFAULT_CLIENT_DIR = fileURLToPath(new URL('../dist', import.meta.url))

/** Builds the Express app without listening, so tests can drive it with supertest. */
export function createApp({ db, config, logger, engine, jobs, storage = createStorage(config.storage), clientDir = DEFAULT_CLIENT_DIR }: AppDeps): Express {
  const app = express()
  logger ??= createLogger(config.log.level)
  engine ??= createEnginePool({ ...config.engine, logger })
  jobs ??= createJobQueue({ url: config.db.url, logger })
  const passport = createPassport(db, config.auth.jwtSecret)

  app.disable('x-powered-by')
  // the proxy in front is then every request's peer: the sign-in limits must count the caller's address
  // it passes on, or one guesser would lock everyone out; without a proxy that header is anyone's to forge
  if (config.http.behindTls) app.set('trust proxy', 1)
  app.use(securityHeaders(config.http.behindTls))
  app.use(
    pinoHttp({
      logger,
      autoLogging: { ignore: (req) => !req.url?.startsWith('/api') },
      // one short line per request: never headers (they carry tokens)
      serializers: {
        req: (req: { id: unknown; method: string; url: string }) => ({ id: req.id, method: req.method, url: req.url.replace(MEDIA_LINK, '$1…') }),
        res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
      },
    }),
  )
  app.use(express.json({ limit: '1mb' }))

  // the route table: every API endpoint goes through it, so listEndpoints(app) knows them all
  const api = endpointTable(app, '/api', { db, passport })
  authEndpoints(api, db, config)
  channelEndpoints(api, db)
  memberEndpoints(api, db, config)
  invitationEndpoints(api, db, config)
  accountEndpoints(api, { db, config, logger })
  puzzleEndpoints(api, db, engine)
  outlineEndpoints(api, db, engine)
  healthEndpoints(api, db)
  recordingEndpoints(api, { db, storage, logger, mediaTokens: mediaTokens(config.auth.jwtSecret) }, config)
  alignmentEndpoints(api, db, jobs)
  rehearsalEndpoints(api, db)
  pictureEndpoints(api, db, engine)
  pipelineEndpoints(api, db)
  // also the episode page's HTML route, outside /api: registered here, before the client's fallback below
  episodeEndpoints(api, { db, storage, logger, grants: episodeGrants(config.auth.jwtSecret), exports: engine, clientDir })
  // the local mail catcher's page, outside /api (also before the client's fallback); never in production
  if (config.mail.caughtMailPage) devMailEndpoints(api)
  app.use('/api', unknownRoute)

  if (existsSync(clientDir)) {
    app.use(express.static(clientDir, { index: false, setHeaders: cacheRule(clientDir) }))
    app.get('/{*splat}', (_req, res) => res.sendFile('index.html', { root: clientDir, headers: { 'Cache-Control': REVALIDATE } }))
  }
  app.use(unknownRoute)
  app.use(errorHandler)
  return app
}

// a playback link's token is a key to the recording for hours: logs keep the route, not the key
const MEDIA_LINK = /^(\/api\/media\/)[^/?]+/

/**
 * helmet's headers with a policy of our own: scripts, styles and fonts only from this origin. HSTS and
 * the upgrade of sub-requests to https only behind TLS (BEHIND_TLS): on plain http, as on loopback, the
 * upgrade would send every sub-request to an https port nobody serves.
 */
function securityHeaders(behindTls: boolean) {
  return helmet({
    contentSecurityPolicy: {
      directives: {
        fontSrc: ["'self'"],
        // PrimeVue's theme writes its CSS into <style> elements at run time; without 'unsafe-inline' the
        // page has no styles. Still no other origin, and scripts stay 'self' only.
        styleSrc: ["'self'", "'unsafe-inline'"],
        upgradeInsecureRequests: behindTls ? [] : null,
      },
    },
    strictTransportSecurity: behindTls,
  })
}

// the shell and anything else unhashed: always asked again (an ETag makes that cheap), so a new build shows at once
const REVALIDATE = 'no-cache'
// Vite's build names every file under assets/ by a hash of its content: a changed file gets a new name
const FOREVER = 'public, max-age=31536000, immutable'

function cacheRule(clientDir: string) {
  const assets = join(resolve(clientDir), 'assets') + sep
  return (res: Response, path: string) => res.setHeader('Cache-Control', path.startsWith(assets) ? FOREVER : REVALIDATE)
}
