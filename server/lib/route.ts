import type { EntityManager } from '@mikro-orm/core'
import type { NextFunction, Request, RequestHandler, Response, Router } from 'express'
import type { z } from 'zod'
import type { Role, SessionUser } from '#shared/schemas/auth.ts'
import type { AppDeps } from './deps.ts'
import { ForbiddenError, UnauthorizedError } from './http-errors.ts'

/**
 * Every API operation is declared once with `defineRoute`: method, path, who may call it, and zod
 * schemas for params, query, body and response. The declaration registers the Express handler (with
 * validation and the role guard) and is the source of /api/openapi.json, so a route cannot exist
 * without appearing in the API description. Access is denied by default: `access` is required.
 */
export type Access = 'public' | 'signed-in' | readonly Role[]

export interface RouteContext<P, Q, B> {
  req: Request
  res: Response
  params: P
  query: Q
  body: B
  /** the signed-in user (null only on public routes) */
  user: SessionUser
  em: EntityManager
  deps: AppDeps
}

export interface RouteDefinition<P = unknown, Q = unknown, B = unknown> {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete'
  /** Express path, e.g. /api/orders/:id */
  path: string
  summary: string
  tags: string[]
  access: Access
  params?: z.ZodType<P>
  query?: z.ZodType<Q>
  body?: z.ZodType<B>
  /** multipart upload: field name and accepted types (documented in OpenAPI) */
  upload?: { field: string; maxBytes: number; types: string[] }
  response?: z.ZodType
  /** content type of a non-JSON success response, e.g. application/pdf */
  produces?: string
  successStatus?: number
  /** extra middleware run after the guard and before validation (e.g. multer) */
  before?: RequestHandler[]
  handler: (ctx: RouteContext<P, Q, B>) => unknown | Promise<unknown>
}

const registry: RouteDefinition<any, any, any>[] = []

export function defineRoute<P = undefined, Q = undefined, B = undefined>(def: RouteDefinition<P, Q, B>): RouteDefinition<P, Q, B> {
  registry.push(def as RouteDefinition<any, any, any>)
  return def
}

export function registeredRoutes(): readonly RouteDefinition<any, any, any>[] {
  return registry
}

export function rolesOf(access: Access, allRoles: readonly Role[]): Role[] {
  if (access === 'public') return []
  if (access === 'signed-in') return [...allRoles]
  return [...access]
}

/** The role guard: 401 signed out, 403 without an allowed role. */
export function guard(access: Access): RequestHandler {
  return (req: Request, _res: Response, next: NextFunction) => {
    if (access === 'public') return next()
    const user = req.user as SessionUser | undefined
    if (!user) return next(new UnauthorizedError())
    if (access === 'signed-in') return next()
    if (!user.roles.some((r) => access.includes(r))) return next(new ForbiddenError())
    next()
  }
}

export function mountRoute(router: Router, def: RouteDefinition<any, any, any>, getEm: (req: Request) => EntityManager): void {
  const handler: RequestHandler = async (req, res) => {
    const params = def.params ? def.params.parse(req.params) : undefined
    const query = def.query ? def.query.parse(req.query) : undefined
    const body = def.body ? def.body.parse(req.body ?? {}) : undefined
    const result = await def.handler({
      req,
      res,
      params,
      query,
      body,
      user: req.user as SessionUser,
      em: getEm(req),
      deps: req.app.locals.deps as AppDeps,
    })
    if (res.headersSent) return
    if (result === undefined) {
      res.status(def.successStatus ?? 204).end()
      return
    }
    res.status(def.successStatus ?? 200).json(result)
  }
  router[def.method](def.path, guard(def.access), ...(def.before ?? []), handler)
}
