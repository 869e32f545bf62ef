import { existsSync } from 'node:fs'
import { resolve } from 'node:path'
import type { EntityManager } from '@mikro-orm/core'
import express, { type Request } from 'express'
import session from 'express-session'
import helmet from 'helmet'
import { pinoHttp } from 'pino-http'
import { type Logger, pino } from 'pino'
import type { AppDeps, AppInternals } from './lib/deps.ts'
import { NotFoundError } from './lib/http-errors.ts'
import { buildOpenApi } from './lib/openapi.ts'
import { mountRoute, registeredRoutes } from './lib/route.ts'
import { DatabaseSessionStore } from './lib/session-store.ts'
import { errorHandler } from './middleware/error-handler.ts'
import { csrfProtection } from './middleware/csrf.ts'
import { loginLimiters } from './modules/auth/auth.routes.ts'
import { createPassport } from './modules/auth/passport.ts'
import { CSRF_EXEMPT_PATHS } from './routes.ts'

export interface AppOptions {
  sessionSecret: string
  cookieSecure: 'auto' | 'true' | 'false'
  trustProxy: string
  logger: Logger
  /** folder of the built client to serve (production); omitted in API tests and dev */
  clientDir?: string
}

function trustProxyValue(v: string): boolean | number | string {
  if (v === 'true') return true
  if (v === 'false') return false
  if (/^\d+$/.test(v)) return Number(v)
  return v
}

/** Builds the Express app. No listen, no env reads: server/index.ts does those. */
export function createApp(deps: AppDeps, options: AppOptions): express.Express {
  const app = express()
  const internals: AppInternals = { passport: createPassport(deps.orm), loginLimiters: loginLimiters() }
  app.locals.deps = deps
  app.locals.internals = internals
  app.disable('x-powered-by')
  app.set('trust proxy', trustProxyValue(options.trustProxy))
  app.set('query parser', 'extended')

  app.use(
    pinoHttp({
      logger: options.logger,
      customLogLevel: (_req, res, err) => (err || res.statusCode >= 500 ? 'error' : res.statusCode >= 400 ? 'warn' : 'info'),
      // our serializers take the raw request and response: pino-http's default wrapping would first build the
      // standard serializers' full objects (every header) on each request, only for these to drop them
      wrapSerializers: false,
      serializers: {
        req: (req: { method: string; originalUrl?: string; url: string; id: unknown }) => ({ id: req.id, method: req.method, url: req.originalUrl ?? req.url }),
        res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
        err: pino.stdSerializers.err,
      },
    }),
  )
  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          styleSrc: ["'self'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          fontSrc: ["'self'"],
          connectSrc: ["'self'"],
          objectSrc: ["'none'"],
          baseUri: ["'self'"],
          formAction: ["'self'"],
          frameAncestors: ["'none'"],
        },
      },
      strictTransportSecurity: options.cookieSecure === 'true',
    }),
  )

  // payment webhooks are verified on the raw body
  app.use('/api/payments/webhook', express.raw({ type: 'application/json', limit: '1mb' }))
  app.use(express.json({ limit: '1mb', strict: true }))

  app.use(
    session({
      name: 'fillwright.sid',
      secret: options.sessionSecret,
      store: new DatabaseSessionStore(deps.orm),
      resave: false,
      saveUninitialized: false,
      rolling: true,
      cookie: {
        httpOnly: true,
        sameSite: 'lax',
        secure: options.cookieSecure === 'auto' ? 'auto' : options.cookieSecure === 'true',
        maxAge: 12 * 3600_000,
      },
    }),
  )
  app.use(internals.passport.initialize())
  app.use(internals.passport.session())
  app.use('/api', csrfProtection(CSRF_EXEMPT_PATHS.map((p) => p.replace(/^\/api/, ''))))
  app.use((_req, res, next) => {
    res.locals.em = deps.orm.em.fork()
    next()
  })

  const api = express.Router()
  const getEm = (req: Request) => req.res!.locals.em as EntityManager
  for (const def of registeredRoutes()) mountRoute(api, def, getEm)
  let openapi: unknown
  api.get('/api/openapi.json', (_req, res) => {
    openapi ??= buildOpenApi(registeredRoutes())
    res.json(openapi)
  })
  app.use(api)
  app.use('/api', (req, _res, next) => next(new NotFoundError(`No API operation ${req.method} ${req.originalUrl}.`)))

  if (options.clientDir && existsSync(resolve(options.clientDir, 'index.html'))) {
    const dir = resolve(options.clientDir)
    app.use(
      express.static(dir, {
        index: false,
        maxAge: '1h',
        setHeaders: (res, path) => {
          if (path.includes('/assets/')) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable')
        },
      }),
    )
    app.get('/{*splat}', (_req, res) => res.sendFile(resolve(dir, 'index.html')))
  }
  app.use(errorHandler)
  return app
}
