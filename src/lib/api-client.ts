import type { z } from 'zod'
import type { ApiErrorBody } from '#shared/schemas/api-error.ts'

/** An error answer of the API (RFC 9457 problem details). */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly body: ApiErrorBody,
  ) {
    super(body.detail || body.title)
    this.name = 'ApiError'
  }
  /** per-field messages, keyed by field path */
  fieldErrors(): Record<string, string> {
    return Object.fromEntries((this.body.errors ?? []).map((e) => [e.field, e.message]))
  }
}

let csrfToken: string | null = null

async function ensureCsrf(): Promise<string> {
  if (csrfToken) return csrfToken
  const res = await fetch('/api/auth/csrf', { credentials: 'same-origin' })
  const body = (await res.json()) as { token: string }
  csrfToken = body.token
  return csrfToken
}

export function setCsrfToken(token: string | null): void {
  csrfToken = token
}

interface RequestOptions {
  query?: Record<string, string | number | boolean | undefined | null>
  signal?: AbortSignal
}

async function request<T>(
  method: string,
  path: string,
  schema: z.ZodType<T> | null,
  body?: unknown,
  options: RequestOptions = {},
  retried = false,
): Promise<T> {
  const url = new URL(path, window.location.origin)
  for (const [k, v] of Object.entries(options.query ?? {})) if (v !== undefined && v !== null && v !== '') url.searchParams.set(k, String(v))
  const headers: Record<string, string> = { accept: 'application/json' }
  const unsafe = method !== 'GET'
  if (unsafe) headers['x-csrf-token'] = await ensureCsrf()
  const isForm = body instanceof FormData
  if (body !== undefined && !isForm) headers['content-type'] = 'application/json'
  const res = await fetch(url, {
    method,
    headers,
    credentials: 'same-origin',
    signal: options.signal,
    body: body === undefined ? undefined : isForm ? body : JSON.stringify(body),
  })
  if (!res.ok) {
    let problem: ApiErrorBody
    try {
      problem = (await res.json()) as ApiErrorBody
    } catch {
      problem = { type: 'about:blank', title: res.statusText, status: res.status, detail: `The server answered ${res.status}.` }
    }
    // a stale CSRF token (new session after sign-in elsewhere): fetch a fresh one once
    if (res.status === 403 && unsafe && !retried && /CSRF/i.test(problem.detail)) {
      csrfToken = null
      return request(method, path, schema, body, options, true)
    }
    throw new ApiError(res.status, problem)
  }
  if (res.status === 204) return undefined as T
  const json: unknown = await res.json()
  return schema ? schema.parse(json) : (json as T)
}

/** Thin fetch wrapper: parses success bodies with the given schema, throws ApiError with the problem body. */
export const apiClient = {
  get: <T>(path: string, schema: z.ZodType<T> | null, options?: RequestOptions) => request('GET', path, schema, undefined, options),
  post: <T>(path: string, schema: z.ZodType<T> | null, body?: unknown, options?: RequestOptions) => request('POST', path, schema, body ?? {}, options),
  put: <T>(path: string, schema: z.ZodType<T> | null, body?: unknown, options?: RequestOptions) => request('PUT', path, schema, body ?? {}, options),
  patch: <T>(path: string, schema: z.ZodType<T> | null, body?: unknown, options?: RequestOptions) => request('PATCH', path, schema, body ?? {}, options),
  delete: <T>(path: string, schema: z.ZodType<T> | null, options?: RequestOptions) => request('DELETE', path, schema, undefined, options),
}
