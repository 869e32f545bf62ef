import { OptimisticLockError, UniqueConstraintViolationException, ValidationError as OrmValidationError } from '@mikro-orm/core'
import type { ErrorRequestHandler } from 'express'
import { ZodError } from 'zod'
import { PhysicsInputError } from '#shared/physics/types.ts'
import { PlanningInputError } from '#shared/planning/errors.ts'
import type { ApiErrorBody } from '#shared/schemas/api-error.ts'
import { HttpError } from '../lib/http-errors.ts'

function problem(status: number, title: string, detail: string, extra: Partial<ApiErrorBody> & Record<string, unknown> = {}): ApiErrorBody {
  return { type: `https://fillwright.test/problems/${status}`, title, status, detail, ...extra }
}

/** Where in the request a zod issue sits: body fields by path, params and query prefixed. */
function zodErrors(err: ZodError) {
  return err.issues.map((i) => ({
    field: i.path.length ? i.path.map(String).join('.') : '(root)',
    message: i.message,
    code: i.code,
  }))
}

/** One place turns every error into RFC 9457 problem details. Unknown errors are logged and become 500. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  let body: ApiErrorBody
  const e = err as Record<string, unknown> & Error
  if (err instanceof ZodError) {
    const errors = zodErrors(err)
    body = problem(400, 'Invalid request', `Check ${errors.map((x) => x.field).join(', ')}: ${errors[0]?.message ?? 'invalid'}`, { errors })
  } else if (err instanceof HttpError) {
    body = problem(err.status, err.title, err.message, { ...(err.errors ? { errors: err.errors } : {}), ...(err.extra ?? {}) })
  } else if (err instanceof PlanningInputError) {
    body = problem(err.status, err.status === 422 ? 'Cannot be done as asked' : 'Invalid request', err.message, {
      errors: [{ field: err.field, message: err.message }],
    })
  } else if (err instanceof PhysicsInputError) {
    body = problem(400, 'Invalid request', err.message, { errors: [{ field: err.field, message: err.message }] })
  } else if (typeof e.status === 'number' && e.status >= 400 && e.status < 500) {
    // body-parser and multer errors: malformed JSON (400), too large (413), bad upload
    const status = e.status as number
    const detail =
      e.type === 'entity.parse.failed'
        ? 'The request body is not valid JSON.'
        : e.type === 'entity.too.large'
          ? 'The request body is too large.'
          : String(e.message || 'Bad request')
    body = problem(status, status === 413 ? 'Payload too large' : 'Invalid request', detail)
  } else if (e.name === 'MulterError') {
    const status = e.code === 'LIMIT_FILE_SIZE' ? 413 : 400
    body = problem(status, status === 413 ? 'Payload too large' : 'Invalid upload', String(e.message), {
      errors: [{ field: String(e.field ?? 'file'), message: String(e.message) }],
    })
  } else if (err instanceof OptimisticLockError) {
    body = problem(409, 'Conflict', 'Someone else changed this record first. Reload to see the current state.')
  } else if (err instanceof UniqueConstraintViolationException) {
    body = problem(409, 'Conflict', 'A record with the same unique value already exists.')
  } else if (err instanceof OrmValidationError) {
    body = problem(400, 'Invalid request', err.message)
  } else {
    req.log?.error({ err }, 'unhandled error')
    body = problem(500, 'Internal error', 'Something went wrong on the server. Nothing was saved; try again or tell your administrator.')
  }
  if (res.headersSent) return
  res.status(body.status).type('application/problem+json').json(body)
}
