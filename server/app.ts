import type { Express } from 'express'
import type { Logger } from 'pino'
import type { Database } from './db/client'
import type { Mailbox } from './mail/mailbox'
import type { Mailer } from './mail/mailer'
import type { RateLimits } from './middleware/rate-limits'
import type { SyncHooks } from './services/sync.service'
import type { FileStorage } from './storage/files'
import { existsSync } from 'node:fs'
import path from 'node:path'
import compression from 'compression'
import cookieParser from 'cookie-parser'
import express from 'express'
import expressStaticGzip from 'express-static-gzip'
import helmet from 'helmet'
import { pinoHttp } from 'pino-http'
import { createAccessTokens } from './auth/tokens'
import { requireAuth } from './middleware/auth'
import { apiNotFound, errorHandler } from './middleware/errorHandler'
import { noStore } from './middleware/no-store'
import { defaultRateLimits, limiter } from './middleware/rate-limits'
import { authRoutes } from './routes/auth.routes'
import { devMailRoutes } from './routes/dev-mail.routes'
import { healthRoutes } from './routes/health.routes'
import { photoRoutes } from './routes/photos.routes'
import { resultsRoutes } from './routes/results.routes'
import { roundRoutes } from './routes/rounds.routes'
import { syncRoutes } from './routes/sync.routes'
import { teamRoutes } from './routes/teams.routes'
import { createAuthService } from './services/auth.service'
import { createInvitationsService } from './services/invitations.service'
import { createPhotosService } from './services/photos.service'
import { createResultsService } from './services/results.service'
import { createRoundsService } from './services/rounds.service'
import { createSyncService } from './services/sync.service'
import { createTeamsService } from './services/teams.service'

export interface AppDeps {
  database: Database
  mailer: Mailer
  logger: Logger
  version: string
  /** Request body limit for JSON, e.g. `1mb`. */
  bodyLimit: string
  /** Base64url signing secret of at least 32 bytes for access tokens. */
  jwtSecret: string
  /** Where people open the app; e-mailed links point here. */
  publicUrl: string
  rateLimits?: Partial<RateLimits>
  /** Test seams inside the sync transaction. */
  syncHooks?: SyncHooks
  /** The fake SMTP server's mailbox; when given, `/api/v1/dev/mail` lists it (see servesDevMail). */
  devMailbox?: Mailbox
  /** Uploaded files (photos): disk under DATA_DIR/uploads by default (server/storage/). */
  files: FileStorage
  /** The built client (`dist/`); when given, the app is served beside the API. */
  staticDir?: string
  /**
   * The peers whose X-Forwarded-For and X-Forwarded-Proto are believed (the reverse proxy's
   * address); none by default, so a client cannot choose the address its rate limits count.
   */
  trustProxy?: string[] | false
  /** Marks the refresh cookie Secure whatever the request looks like (production, behind HTTPS). */
  secureCookies?: boolean
  /** Extra pages served before the client (the phone set-up page of `npm run serve`). */
  pages?: express.Router
}

/**
 * The built client, precompressed at build (vite.config.ts writes `.br` and `.gz` beside each text
 * file): the encoding the browser accepts is chosen per request, brotli first, with `Vary:
 * Accept-Encoding` so a cache keeps one copy per encoding.
 */
function serveClient(app: Express, dir: string): void {
  app.use(expressStaticGzip(dir, {
    enableBrotli: true,
    orderPreference: ['br', 'gzip'],
    index: false,
    serveStatic: {
      index: false,
      setHeaders(res, file) {
        // The file sent may be the compressed twin (`sw.js.br`): its headers are those of the original.
        const name = path.basename(file).replace(/\.(?:br|gz)$/, '')
        // Hashed build assets never change; the shell, manifest and service worker must be re-checked.
        if (file.includes(`${path.sep}assets${path.sep}`))
          res.setHeader('Cache-Control', 'public, max-age=31536000, immutable')
        else if (name === 'sw.js' || name.endsWith('.html') || name.endsWith('.webmanifest'))
          res.setHeader('Cache-Control', 'no-cache')
      },
    },
  }))
  const indexHtml = path.join(dir, 'index.html')
  app.get(/^(?!\/api\/).*/, (req, res, next) => {
    if (!req.accepts('html') || !existsSync(indexHtml))
      return next()
    res.setHeader('Cache-Control', 'no-cache')
    res.sendFile(indexHtml)
  })
}

/** Builds the Express app on the given dependencies; `server/index.ts` is what listens. */
export function createApp(deps: AppDeps): Express {
  const app = express()
  app.disable('x-powered-by')
  app.set('trust proxy', deps.trustProxy ?? false)

  app.use(helmet({
    contentSecurityPolicy: {
      directives: {
        // Ionicons loads its inline SVG icons through fetch() of data: URLs.
        'connect-src': ['\'self\'', 'data:'],
        'img-src': ['\'self\'', 'data:', 'blob:'],
        'worker-src': ['\'self\''],
        'upgrade-insecure-requests': null,
      },
    },
  }))
  app.use(pinoHttp({
    logger: deps.logger,
    customLogLevel: (_req, res, err) => (err || res.statusCode >= 500 ? 'error' : res.statusCode >= 400 ? 'warn' : 'debug'),
    // Method, path and status are enough to follow a request; headers may carry tokens.
    serializers: {
      req: (req: { id: unknown, method: string, url: string }) => ({ id: req.id, method: req.method, url: req.url.split('?')[0] }),
      res: (res: { statusCode: number }) => ({ status: res.statusCode }),
    },
  }))
  // Answers made per request (JSON, the app shell) are compressed on the way out, brotli when the
  // client takes it; responses already encoded (the precompressed client) and images pass as they are.
  app.use(compression({ threshold: 1024 }))
  app.use(express.json({ limit: deps.bodyLimit }))
  app.use(cookieParser())

  const { db } = deps.database
  const tokens = createAccessTokens(deps.jwtSecret)
  const limits = { ...defaultRateLimits, ...deps.rateLimits }
  const teams = createTeamsService(db)
  const invitations = createInvitationsService({ db, teams, mailer: deps.mailer, publicUrl: deps.publicUrl })
  const auth = createAuthService({ db, tokens, mailer: deps.mailer, publicUrl: deps.publicUrl })
  const sync = createSyncService({ db, teams, hooks: deps.syncHooks })
  const rounds = createRoundsService({ db, teams })
  const results = createResultsService({ db, teams, mailer: deps.mailer })

  const api = express.Router()
  api.use(noStore)
  api.use(healthRoutes({ pool: deps.database.pool, version: deps.version }))
  if (deps.devMailbox)
    api.use(devMailRoutes(deps.devMailbox))
  api.use(authRoutes(auth, { register: limiter(limits.register), login: limiter(limits.login), reset: limiter(limits.reset) }, { secureCookies: deps.secureCookies ?? false }))
  // Signed-in routes; scoped by path so that an unknown route still answers 404, not 401.
  api.use(['/me', '/teams', '/invitations', '/sync'], requireAuth(tokens, auth))
  api.use(teamRoutes(teams, invitations))
  api.use(syncRoutes(sync))
  api.use(roundRoutes(rounds))
  api.use(resultsRoutes(results))
  api.use(photoRoutes(createPhotosService({ teams, files: deps.files })))
  app.use('/api/v1', api)
  app.use('/api', apiNotFound)

  if (deps.pages)
    app.use(deps.pages)
  if (deps.staticDir)
    serveClient(app, deps.staticDir)

  app.use(errorHandler)
  return app
}
