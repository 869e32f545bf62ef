/** Typed HTTP errors; middleware/error-handler.ts turns them into RFC 9457 problem details. */
export interface FieldError {
  field: string
  message: string
  code?: string
}

export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly title: string,
    message: string,
    readonly errors?: FieldError[],
    readonly extra?: Record<string, unknown>,
  ) {
    super(message)
    this.name = 'HttpError'
  }
}

export class BadRequestError extends HttpError {
  constructor(message: string, errors?: FieldError[]) {
    super(400, 'Invalid request', message, errors)
  }
}
export class UnauthorizedError extends HttpError {
  constructor(message = 'Sign in to continue.') {
    super(401, 'Not signed in', message)
  }
}
export class ForbiddenError extends HttpError {
  constructor(message = 'Your role does not allow this.') {
    super(403, 'Forbidden', message)
  }
}
export class NotFoundError extends HttpError {
  constructor(message = 'Not found.') {
    super(404, 'Not found', message)
  }
}
export class ConflictError extends HttpError {
  constructor(message: string, extra?: Record<string, unknown>) {
    super(409, 'Conflict', message, undefined, extra)
  }
}
export class UnprocessableError extends HttpError {
  constructor(message: string, errors?: FieldError[]) {
    super(422, 'Cannot be done as asked', message, errors)
  }
}
