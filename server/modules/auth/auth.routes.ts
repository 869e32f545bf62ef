import type { RequestHandler } from 'express'
import { rateLimit } from 'express-rate-limit'
import type { AppInternals } from '../../lib/deps.ts'
import { CsrfTokenSchema, LoginInputSchema, LoginResultSchema, OkSchema, type SessionUser, SessionUserSchema } from '#shared/schemas/auth.ts'
import { HttpError, UnauthorizedError } from '../../lib/http-errors.ts'
import { defineRoute } from '../../lib/route.ts'
import { csrfToken } from '../../middleware/csrf.ts'

const WINDOW_MS = 15 * 60_000
const MAX_FAILURES = 10

function tooMany(): RequestHandler {
  return (_req, _res, next) =>
    next(new HttpError(429, 'Too many attempts', 'Too many failed sign-in attempts. Wait 15 minutes and try again, or ask an administrator.'))
}

/** Wrong-password attempts are limited per address and per account: the 11th failure in 15 minutes gets 429. */
export function loginLimiters(): RequestHandler[] {
  const common = {
    windowMs: WINDOW_MS,
    limit: MAX_FAILURES,
    skipSuccessfulRequests: true,
    // only wrong credentials count as failures (not CSRF or validation errors)
    requestWasSuccessful: (_req: unknown, res: { statusCode: number }) => res.statusCode !== 401,
    standardHeaders: 'draft-8' as const,
    legacyHeaders: false,
    handler: tooMany(),
  }
  return [
    rateLimit({ ...common, identifier: 'login-address' }),
    rateLimit({
      ...common,
      identifier: 'login-account',
      keyGenerator: (req) =>
        `account:${String((req.body as { email?: unknown } | undefined)?.email ?? '')
          .trim()
          .toLowerCase()}`,
    }),
  ]
}

/** Runs this app's login limiters (created per app in createApp, so tests do not share counters). */
const runLoginLimiters: RequestHandler = (req, res, next) => {
  const limiters = (req.app.locals.internals as AppInternals).loginLimiters
  let i = 0
  const step = (err?: unknown): void => {
    if (err) return next(err)
    const limiter = limiters[i++]
    if (!limiter) return next()
    void limiter(req, res, step)
  }
  step()
}

defineRoute({
  method: 'get',
  path: '/api/auth/csrf',
  summary: 'The CSRF token to send as X-CSRF-Token on unsafe requests',
  tags: ['auth'],
  access: 'public',
  response: CsrfTokenSchema,
  handler: ({ req }) => ({ token: csrfToken(req) }),
})

defineRoute({
  method: 'post',
  path: '/api/auth/login',
  summary: 'Sign in with e-mail and password',
  tags: ['auth'],
  access: 'public',
  body: LoginInputSchema,
  response: LoginResultSchema,
  before: [runLoginLimiters],
  handler: ({ req, body }) =>
    new Promise((resolve, reject) => {
      req.body = body
      const { passport } = req.app.locals.internals as AppInternals
      passport.authenticate('local', { session: false }, (err: unknown, user: SessionUser | false) => {
        if (err) return reject(err)
        if (!user) return reject(new UnauthorizedError('E-mail or password is not right.'))
        // passport regenerates the session id here (session fixation); keep the CSRF token
        req.login(user, { session: true, keepSessionInfo: true }, (loginErr) => {
          if (loginErr) return reject(loginErr)
          resolve({ user, csrfToken: csrfToken(req) })
        })
      })(req, req.res, reject)
    }),
})

defineRoute({
  method: 'post',
  path: '/api/auth/logout',
  summary: 'Sign out',
  tags: ['auth'],
  access: 'signed-in',
  response: OkSchema,
  handler: ({ req }) =>
    new Promise((resolve, reject) => {
      req.logout({ keepSessionInfo: false }, (err) => {
        if (err) return reject(err)
        req.session.destroy((destroyErr) => (destroyErr ? reject(destroyErr) : resolve({ ok: true as const })))
      })
    }),
})

defineRoute({
  method: 'get',
  path: '/api/auth/me',
  summary: 'The signed-in user with roles',
  tags: ['auth'],
  access: 'signed-in',
  response: SessionUserSchema,
  handler: ({ user }) => user,
})
