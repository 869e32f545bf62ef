import { randomBytes, timingSafeEqual } from 'node:crypto'
import type { Request, RequestHandler } from 'express'
import { ForbiddenError } from '../lib/http-errors.ts'

declare module 'express-session' {
  interface SessionData {
    csrfToken?: string
  }
}

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS'])

/** The session's CSRF token, created on first use. */
export function csrfToken(req: Request): string {
  if (!req.session.csrfToken) req.session.csrfToken = randomBytes(24).toString('base64url')
  return req.session.csrfToken
}

/**
 * Synchronizer-token CSRF check: unsafe methods must send X-CSRF-Token equal to the session's token.
 * `exempt` lists paths that authenticate otherwise (signed payment webhooks).
 */
export function csrfProtection(exempt: string[]): RequestHandler {
  return (req, _res, next) => {
    if (SAFE.has(req.method) || exempt.includes(req.path)) return next()
    const sent = req.get('x-csrf-token') ?? ''
    const expected = req.session?.csrfToken ?? ''
    const a = Buffer.from(sent)
    const b = Buffer.from(expected)
    if (!expected || a.length !== b.length || !timingSafeEqual(a, b)) {
      return next(new ForbiddenError('Missing or wrong X-CSRF-Token header. Fetch a token from GET /api/auth/csrf.'))
    }
    next()
  }
}
