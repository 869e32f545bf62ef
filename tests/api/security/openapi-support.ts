import { createHash } from 'node:crypto'
import type { MikroORM } from '@mikro-orm/core'
import fc from 'fast-check'
import type { Response, Test } from 'supertest'
import { expect } from 'vitest'
import { ROLES, type Role } from '#shared/schemas/auth.ts'
import type { SignedInAgent, TestApp } from '#tests/support/test-app.ts'

/**
 * Helpers shared by the generated security suites: they read GET /api/openapi.json and walk every
 * operation, so an operation added later is covered without touching the tests.
 */

export type JsonSchema = Record<string, any>
export type Method = 'get' | 'post' | 'put' | 'patch' | 'delete'

export interface Operation {
  method: Method
  /** OpenAPI path, e.g. /api/orders/{id} */
  path: string
  op: JsonSchema
  roles: Role[]
  isPublic: boolean
  unsafe: boolean
  /** JSON request body schema (with its $defs), if any */
  jsonBody?: JsonSchema
  /** multipart upload, if any */
  upload?: { field: string; types: string[]; maxBytes: number }
  pathParams: JsonSchema[]
  queryParams: JsonSchema[]
}

export const ALL_ROLES: readonly Role[] = ROLES

export async function loadOperations(t: TestApp): Promise<Operation[]> {
  const { agent } = await t.anonymous()
  const res = await agent.get('/api/openapi.json').expect(200)
  const doc = res.body as { paths: Record<string, Record<string, JsonSchema>> }
  const out: Operation[] = []
  for (const [path, ops] of Object.entries(doc.paths)) {
    for (const [method, op] of Object.entries(ops)) {
      const roles = op['x-roles'] as Role[]
      expect(Array.isArray(roles), `${method} ${path} has x-roles`).toBe(true)
      const content = op.requestBody?.content ?? {}
      const multipart = content['multipart/form-data']?.schema as JsonSchema | undefined
      let upload: Operation['upload']
      if (multipart) {
        const [field, prop] = Object.entries(multipart.properties as Record<string, JsonSchema>)[0] as [string, JsonSchema]
        upload = {
          field,
          types: String(prop.contentMediaType ?? '')
            .split(',')
            .map((s) => s.trim())
            .filter(Boolean),
          maxBytes: Number(op.requestBody['x-max-bytes']),
        }
      }
      const params = (op.parameters ?? []) as JsonSchema[]
      out.push({
        method: method as Method,
        path,
        op,
        roles,
        isPublic: roles.length === 0,
        unsafe: method !== 'get',
        jsonBody: content['application/json']?.schema,
        upload,
        pathParams: params.filter((p) => p.in === 'path'),
        queryParams: params.filter((p) => p.in === 'query'),
      })
    }
  }
  return out
}

/** The URL with every path parameter replaced (by `fill`, default 1). */
export function urlOf(o: Operation, fill: (name: string) => string = () => '1'): string {
  return o.path.replace(/\{([^}]+)\}/g, (_m, name: string) => fill(name))
}

export function call(agent: SignedInAgent['agent'], method: Method, url: string): Test {
  return (agent as unknown as Record<Method, (u: string) => Test>)[method](url)
}

export function label(o: Operation): string {
  return `${o.method.toUpperCase()} ${o.path}`
}

/** RFC 9457 problem details with the shape the API promises. */
export function expectProblem(res: Response, what: string): void {
  expect(res.headers['content-type'] ?? '', `${what}: content type`).toMatch(/^application\/problem\+json/)
  expect(typeof res.body.type, `${what}: type`).toBe('string')
  expect(typeof res.body.title, `${what}: title`).toBe('string')
  expect(res.body.status, `${what}: status in body`).toBe(res.status)
  expect(typeof res.body.detail, `${what}: detail`).toBe('string')
}

/**
 * Signed-in agents per role that heal themselves: if an operation ended the session (sign-out) the
 * agent signs in again before the next request.
 */
export class AgentPool {
  private agents = new Map<Role | 'anonymous', SignedInAgent>()
  constructor(private readonly t: TestApp) {}

  async get(role: Role | 'anonymous'): Promise<SignedInAgent> {
    let a = this.agents.get(role)
    if (!a) {
      a = role === 'anonymous' ? await this.t.anonymous() : await this.t.signIn(role)
      this.agents.set(role, a)
    }
    return a
  }

  /** Call after an unsafe request: re-signs-in when the session is gone. */
  async heal(role: Role | 'anonymous'): Promise<void> {
    const a = this.agents.get(role)
    if (!a) return
    if (role === 'anonymous') {
      const r = await a.agent.get('/api/auth/csrf')
      a.csrf = r.body.token
      return
    }
    const me = await a.agent.get('/api/auth/me')
    if (me.status === 401) this.agents.delete(role)
  }
}

// ---------------------------------------------------------------------------------------------
// Values from JSON Schema (zod's draft 2020-12 output): a best-effort valid example, so that a
// single mutated property is the only thing wrong with a request.

function resolveRef(ref: string, root: JsonSchema): JsonSchema {
  if (!ref.startsWith('#/')) return {}
  let node: any = root
  for (const part of ref.slice(2).split('/')) node = node?.[part.replace(/~1/g, '/').replace(/~0/g, '~')]
  return (node ?? {}) as JsonSchema
}

export function deref(schema: JsonSchema, root: JsonSchema): JsonSchema {
  let s = schema
  for (let i = 0; i < 10 && s && typeof s.$ref === 'string'; i++)
    s = { ...resolveRef(s.$ref, root), ...Object.fromEntries(Object.entries(s).filter(([k]) => k !== '$ref')) }
  return s ?? {}
}

/** The non-null branch of a schema (anyOf/oneOf with null, type arrays). */
export function mainBranch(schema: JsonSchema, root: JsonSchema): JsonSchema {
  let s = deref(schema, root)
  for (let i = 0; i < 5; i++) {
    const alts = (s.anyOf ?? s.oneOf) as JsonSchema[] | undefined
    if (alts?.length) {
      const pick = alts.map((a) => deref(a, root)).find((a) => a.type !== 'null') ?? alts[0]!
      s = { ...pick }
      continue
    }
    if (Array.isArray(s.allOf) && s.allOf.length) {
      s = { ...deref(s.allOf[0], root), ...Object.fromEntries(Object.entries(s).filter(([k]) => k !== 'allOf')) }
      continue
    }
    break
  }
  return s
}

export function typeOf(schema: JsonSchema, root: JsonSchema): string | undefined {
  const s = mainBranch(schema, root)
  if (s.const !== undefined) return typeof s.const === 'number' ? 'number' : typeof s.const
  if (Array.isArray(s.enum)) return typeof s.enum[0] === 'number' ? 'number' : typeof s.enum[0]
  if (Array.isArray(s.type)) return s.type.find((x: string) => x !== 'null')
  if (typeof s.type === 'string') return s.type
  if (s.properties) return 'object'
  return undefined
}

function stringExample(s: JsonSchema): string {
  const min = Number(s.minLength ?? 0)
  const max = Number(s.maxLength ?? 64)
  const fitting = (v: string) => (v.length >= min && v.length <= max ? v : undefined)
  switch (s.format) {
    case 'email':
      return fitting('sample.person@example.test') ?? 'a@b.co'
    case 'date':
      return '2026-12-02'
    case 'date-time':
      return '2026-12-02T10:00:00.000Z'
    case 'uuid':
      return '3f1c2a4e-8b7d-4c1e-9a2b-5d6e7f809a1b'
    case 'uri':
    case 'url':
      return 'https://example.test/sample'
  }
  if (typeof s.pattern === 'string') {
    try {
      const samples = fc.sample(fc.stringMatching(new RegExp(s.pattern)), { numRuns: 40, seed: 42 })
      const ok = samples.find((v) => v.length >= min && v.length <= max)
      if (ok !== undefined) return ok
    } catch {
      // an unusual pattern: fall through to a plain value
    }
  }
  const base = 'Sample'
  if (base.length >= min && base.length <= max) return base
  return 'S'.repeat(Math.max(min, 1)).slice(0, Math.max(max, 1))
}

function numberExample(s: JsonSchema, integer: boolean): number {
  const lo = s.minimum ?? (s.exclusiveMinimum !== undefined ? Number(s.exclusiveMinimum) + (integer ? 1 : 1e-3) : undefined)
  const hi = s.maximum ?? (s.exclusiveMaximum !== undefined ? Number(s.exclusiveMaximum) - (integer ? 1 : 1e-3) : undefined)
  let v: number
  if (lo !== undefined && hi !== undefined) v = (Number(lo) + Number(hi)) / 2
  else if (lo !== undefined) v = Number(lo) + 1
  else if (hi !== undefined) v = Math.min(Number(hi) - 1, 1)
  else v = 1
  if (integer) v = Math.floor(v)
  if (typeof s.multipleOf === 'number') v = Math.round(v / s.multipleOf) * s.multipleOf
  if (lo !== undefined && v < Number(lo)) v = Number(lo)
  if (hi !== undefined && v > Number(hi)) v = Number(hi)
  return v
}

export function exampleOf(schema: JsonSchema, root: JsonSchema, depth = 0): unknown {
  const s = mainBranch(schema, root)
  if (depth > 8) return null
  if (s.const !== undefined) return s.const
  if (Array.isArray(s.enum)) return s.enum[0]
  if (s.default !== undefined && typeof s.default !== 'object') return s.default
  switch (typeOf(s, root)) {
    case 'string':
      return stringExample(s)
    case 'integer':
      return numberExample(s, true)
    case 'number':
      return numberExample(s, false)
    case 'boolean':
      return true
    case 'null':
      return null
    case 'array': {
      const n = Math.max(Number(s.minItems ?? 1), 1)
      const items = Array.isArray(s.prefixItems) ? (s.prefixItems as JsonSchema[]) : undefined
      if (items) return items.map((it) => exampleOf(it, root, depth + 1))
      return Array.from({ length: Math.min(n, Number(s.maxItems ?? n)) }, () => exampleOf(s.items ?? {}, root, depth + 1))
    }
    case 'object': {
      const out: Record<string, unknown> = {}
      const props = (s.properties ?? {}) as Record<string, JsonSchema>
      for (const name of (s.required ?? []) as string[]) out[name] = exampleOf(props[name] ?? {}, root, depth + 1)
      return out
    }
    default:
      return 'sample'
  }
}

/** A value of the wrong JSON type for the property. */
export function wrongTypeFor(schema: JsonSchema, root: JsonSchema): unknown {
  switch (typeOf(schema, root)) {
    case 'string':
      return 12345
    case 'integer':
    case 'number':
      return 'not-a-number'
    case 'boolean':
      return 'not-a-boolean'
    case 'array':
      return 'not-an-array'
    case 'object':
      return 'not-an-object'
    default:
      return { unexpected: ['structure'] }
  }
}

// ---------------------------------------------------------------------------------------------
// Database fingerprint: row counts and a content hash of every table, to prove a refused request
// wrote nothing. Session rows change with every request (rolling expiry), so only their count is kept.

export async function tableNames(orm: MikroORM): Promise<string[]> {
  const conn = orm.em.getConnection()
  const pg = orm.config.get('driver')?.name === 'PostgreSqlDriver'
  const rows: { name: string }[] = pg
    ? await conn.execute<{ name: string }[]>(
        `select table_name as name from information_schema.tables where table_schema = current_schema() and table_type = 'BASE TABLE' order by 1`,
      )
    : await conn.execute<{ name: string }[]>(`select name from sqlite_master where type = 'table' and name not like 'sqlite_%' order by 1`)
  return rows.map((r) => r.name)
}

export async function fingerprint(orm: MikroORM): Promise<Record<string, string>> {
  const conn = orm.em.getConnection()
  const out: Record<string, string> = {}
  for (const name of await tableNames(orm)) {
    if (name === 'sessions') {
      const [row]: { n: number | string }[] = await conn.execute(`select count(*) as n from "${name}"`)
      out[name] = `count=${Number(row?.n)}`
      continue
    }
    const rows: Record<string, unknown>[] = await conn.execute(`select * from "${name}"`)
    const lines = rows.map((r) => JSON.stringify(r, (_k, v) => (typeof v === 'bigint' ? String(v) : v))).sort()
    out[name] = `count=${rows.length} sha256=${createHash('sha256').update(lines.join('\n')).digest('hex').slice(0, 16)}`
  }
  return out
}

/** Roles allowed for an operation, 'anonymous' for public ones. */
export function callerFor(o: Operation): Role | 'anonymous' {
  if (o.isPublic) return 'anonymous'
  return o.roles.includes('admin') ? 'admin' : (o.roles[0] as Role)
}
