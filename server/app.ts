import type { Express } from 'express'
import type { Logger } from 'pino'
import type { Database } from './db/client'
import type { Mailbox } from './mail/mailbox'
import type { Mailer } from './mail/mailer'
import { existsSync } from 'node:fs'
import path from 'node:path'
import express from 'express'
import helmet from 'helmet'
import { pinoHttp } from 'pino-http'
import { apiNotFound, errorHandler } from './middleware/errorHandler'
import { devMailRoutes } from './routes/dev-mail.routes'
import { healthRoutes } from './routes/health.routes'

export interface AppDeps {
  database: Database
  mailer: Mailer
  logger: Logger
  version: string
  /** Request body limit for JSON, e.g. `1mb`. */
  bodyLimit: string
  /** The fake SMTP server's mailbox; when given, `/api/v1/dev/mail` lists it (never in production). */
  devMailbox?: Mailbox
  /** The built client (`dist/`); when given, the app is served beside the API. */
  staticDir?: string
}

function serveClient(app: Express, dir: string): void {
  app.use(express.static(dir, {
    index: false,
    setHeaders(res, file) {
      const name = path.basename(file)
      // Hashed build assets never change; the shell, manifest and service worker must be re-checked.
      if (file.includes(`${path.sep}assets${path.sep}`))
        res.setHeader('Cache-Control', 'public, max-age=31536000, immutable')
      else if (name === 'sw.js' || name.endsWith('.html') || name.endsWith('.webmanifest'))
        res.setHeader('Cache-Control', 'no-cache')
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
  app.set('trust proxy', 'loopback')

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
  app.use(express.json({ limit: deps.bodyLimit }))

  const api = express.Router()
  api.use(healthRoutes({ pool: deps.database.pool, version: deps.version }))
  if (deps.devMailbox)
    api.use(devMailRoutes(deps.devMailbox))
  app.use('/api/v1', api)
  app.use('/api', apiNotFound)

  if (deps.staticDir)
    serveClient(app, deps.staticDir)

  app.use(errorHandler)
  return app
}
