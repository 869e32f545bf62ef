import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createTestApp, type TestApp } from '#tests/support/test-app.ts'
import {
  AgentPool,
  call,
  callerFor,
  deref,
  exampleOf,
  expectProblem,
  fingerprint,
  type JsonSchema,
  label,
  loadOperations,
  mainBranch,
  type Operation,
  typeOf,
  urlOf,
  wrongTypeFor,
} from './openapi-support.ts'

/**
 * Bad input, generated from GET /api/openapi.json. For every operation with a JSON body, path or
 * query parameters, or an upload, as a role the operation allows: malformed JSON, wrong root type,
 * a wrong type in each property, each required field missing, an unknown field, 1 MB strings,
 * operator-like objects ({"$gt": ""}), path traversal in path parameters, an oversized body (> 1 MB),
 * and for uploads a mistyped and an oversized file. Every answer must be a 4xx problem details
 * (never 5xx) and the database must be unchanged afterwards (row counts and a content hash of every
 * table). Each mutated request starts from a body that is otherwise valid per the schema, so the
 * mutation is the only thing wrong with it.
 */

let t: TestApp
let ops: Operation[]
let pool: AgentPool
const HUGE = 'x'.repeat(1_000_000)
const TRAVERSAL = '../../etc/passwd'
const PASSWD_LEAK = /root:.*:0:0:/

interface Case {
  name: string
  url: string
  query?: Record<string, unknown>
  /** JSON value to send, or raw text with a JSON content type */
  body?: unknown
  raw?: string
  /** statuses accepted besides "any 4xx" narrowing, e.g. [413] */
  expect?: number[]
  /** property the problem details should name (for schema-level refusals) */
  field?: string
}

beforeAll(async () => {
  t = await createTestApp()
  ops = await loadOperations(t)
  pool = new AgentPool(t)
})
afterAll(async () => {
  await t?.close()
})

function bodyCases(o: Operation, url: string): Case[] {
  const root = o.jsonBody as JsonSchema
  const schema = mainBranch(root, root)
  const base = exampleOf(root, root) as Record<string, unknown>
  const props = (schema.properties ?? {}) as Record<string, JsonSchema>
  const required = new Set((schema.required ?? []) as string[])
  const cases: Case[] = [
    { name: 'malformed JSON', url, raw: '{"a": ' },
    { name: 'malformed JSON (trailing garbage)', url, raw: '{"a": 1}}}' },
    { name: 'root is an array', url, body: [base] },
    { name: 'root is a string', url, raw: '"just a string"' },
    { name: 'root is null', url, raw: 'null' },
    { name: 'oversized body (> 1 MB)', url, body: { ...base, padding: 'x'.repeat(1_100_000) }, expect: [413] },
    { name: 'operator-like root', url, body: { $where: 'sleep(1000)', $gt: '' } },
  ]
  if (typeOf(schema, root) === 'object') cases.push({ name: 'unknown field', url, body: { ...base, unexpectedField: 'x' }, field: 'unexpectedField' })
  for (const [name, propSchema] of Object.entries(props)) {
    const p = deref(propSchema, root)
    cases.push({ name: `wrong type in ${name}`, url, body: { ...base, [name]: wrongTypeFor(p, root) }, field: name })
    cases.push({ name: `operator-like object in ${name}`, url, body: { ...base, [name]: { $gt: '' } }, field: name })
    if (required.has(name)) {
      const { [name]: _dropped, ...rest } = base
      cases.push({ name: `missing required ${name}`, url, body: rest, field: name })
    }
    if (typeOf(p, root) === 'string') cases.push({ name: `1 MB string in ${name}`, url, body: { ...base, [name]: HUGE }, field: name })
  }
  return cases
}

function paramCases(o: Operation): Case[] {
  const cases: Case[] = []
  for (const p of o.pathParams) {
    const fill = (v: string) => urlOf(o, (n) => (n === p.name ? encodeURIComponent(v) : '1'))
    cases.push({ name: `path traversal in :${p.name}`, url: fill(TRAVERSAL) })
    cases.push({ name: `encoded traversal in :${p.name}`, url: fill('..%2f..%2fetc%2fpasswd') })
    cases.push({ name: `operator-like :${p.name}`, url: fill('{"$gt":""}') })
    cases.push({ name: `10 kB :${p.name}`, url: fill('9'.repeat(10_000)) })
    if (['integer', 'number'].includes(typeOf(p.schema, p.schema) ?? '')) cases.push({ name: `non-numeric :${p.name}`, url: fill('abc') })
    if (['integer', 'number'].includes(typeOf(p.schema, p.schema) ?? '')) cases.push({ name: `negative :${p.name}`, url: fill('-1') })
  }
  const url = urlOf(o)
  for (const q of o.queryParams) {
    const t = typeOf(q.schema, q.schema)
    if (t === 'integer' || t === 'number') cases.push({ name: `non-numeric ?${q.name}`, url, query: { [q.name]: 'abc' }, field: q.name })
    cases.push({ name: `operator-like ?${q.name}[$gt]`, url: `${url}?${encodeURIComponent(q.name)}[$gt]=`, field: q.name })
    // 8 kB: long enough to pass no sane length limit, short enough to reach the app (Node refuses URLs
    // over its 16 kB header limit with a bare 431 before Express sees them; checked separately below)
    cases.push({ name: `8 kB ?${q.name}`, url: `${url}?${encodeURIComponent(q.name)}=${'x'.repeat(8_000)}` })
  }
  if (o.queryParams.length) cases.push({ name: 'unknown query parameter', url, query: { unexpectedParam: '1' } })
  return cases
}

describe('bad input from /api/openapi.json', () => {
  it('answers every bad input with 4xx problem details and writes nothing', async () => {
    let tried = 0
    let namedField = 0
    let fieldCases = 0
    const failures: string[] = []
    const unnamed: string[] = []
    const targets = ops.filter((o) => o.jsonBody || o.pathParams.length || o.queryParams.length)
    expect(targets.length).toBeGreaterThan(0)
    // every agent is signed in before the first fingerprint (sign-in writes a session row)
    for (const o of targets) await pool.get(callerFor(o))
    const before = await fingerprint(t.orm)

    for (const o of targets) {
      const who = callerFor(o)
      const cases = [...(o.jsonBody ? bodyCases(o, urlOf(o)) : []), ...paramCases(o)]
      const opBefore = await fingerprint(t.orm)
      for (const c of cases) {
        const a = await pool.get(who)
        let req = call(a.agent, o.method, c.url).set('x-csrf-token', a.csrf)
        if (c.query) req = req.query(c.query as Record<string, string>)
        let res: Awaited<typeof req>
        if (c.raw !== undefined) res = await req.set('content-type', 'application/json').send(c.raw)
        else if (c.body !== undefined && o.method !== 'get') res = await req.send(c.body as object)
        else if (o.jsonBody && o.method !== 'get') res = await req.send(exampleOf(o.jsonBody, o.jsonBody) as object)
        else res = await req
        tried++
        const what = `${label(o)} as ${who}: ${c.name} → ${res.status}`
        if (res.status < 400 || res.status >= 500) {
          failures.push(`${what} ${res.status >= 500 ? String(res.body?.detail ?? '') : '(accepted)'}`)
        } else {
          if (c.expect && !c.expect.includes(res.status)) failures.push(`${what}, expected ${c.expect.join('/')}`)
          try {
            expectProblem(res, what)
          } catch (e) {
            failures.push(`${what}: not problem details (${(e as Error).message.split('\n')[0]})`)
          }
          if (c.field && res.status === 400) {
            fieldCases++
            const errors = (res.body.errors ?? []) as { field: string; message: string }[]
            const fields = errors.map((e) => e.field)
            // the field itself, a nested path under it, or (unknown keys) the root naming the key in its message
            const named = errors.some(
              (e) => e.field === c.field || e.field.startsWith(`${c.field}.`) || e.field.endsWith(`.${c.field}`) || e.message.includes(c.field as string),
            )
            if (named || String(res.body.detail).includes(c.field)) namedField++
            else unnamed.push(`${what}: problem details name ${JSON.stringify(fields)}, not ${c.field}`)
          }
        }
        if (PASSWD_LEAK.test(res.text ?? '')) failures.push(`${what}: response contains /etc/passwd content`)
        if (o.unsafe) await pool.heal(who)
      }
      const opAfter = await fingerprint(t.orm)
      for (const [table, fp] of Object.entries(opAfter))
        if (opBefore[table] !== fp) failures.push(`${label(o)}: table ${table} changed (${opBefore[table]} → ${fp})`)
    }

    const after = await fingerprint(t.orm)
    console.info(`bad input: ${tried} requests over ${targets.length} operations; ${namedField}/${fieldCases} schema refusals named the field`)
    expect(failures).toEqual([])
    expect(unnamed, 'a refusal names the field that was wrong').toEqual([])
    expect(after).toEqual(before)
  }, 900_000)

  it('every JSON request body object refuses unknown fields (additionalProperties: false)', () => {
    // z.strictObject makes zod refuse unknown keys; a plain z.object silently drops them, which hides
    // client mistakes and lets operator-like objects through where every property is optional
    const loose: string[] = []
    const walk = (schema: JsonSchema, root: JsonSchema, where: string, seen: Set<JsonSchema>) => {
      const s = deref(schema, root)
      if (!s || typeof s !== 'object' || seen.has(s)) return
      seen.add(s)
      for (const alt of [...(s.anyOf ?? []), ...(s.oneOf ?? []), ...(s.allOf ?? [])] as JsonSchema[]) walk(alt, root, where, seen)
      if (s.properties) {
        if (s.additionalProperties !== false) loose.push(where || '(root)')
        for (const [k, v] of Object.entries(s.properties as Record<string, JsonSchema>)) walk(v, root, where ? `${where}.${k}` : k, seen)
      }
      if (s.items) walk(s.items as JsonSchema, root, `${where}[]`, seen)
    }
    let objects = 0
    const report: string[] = []
    for (const o of ops.filter((x) => x.jsonBody)) {
      loose.length = 0
      walk(o.jsonBody as JsonSchema, o.jsonBody as JsonSchema, '', new Set())
      objects++
      const paths = [...new Set(loose)]
      if (paths.length) report.push(`${label(o)}: ${paths.length} object(s) not strict: ${paths.slice(0, 6).join(', ')}${paths.length > 6 ? ', …' : ''}`)
    }
    expect(objects).toBeGreaterThan(0)
    expect(report, 'request bodies with objects that accept unknown fields').toEqual([])
  })

  it('a URL beyond the HTTP header limit is refused before the app (431)', async () => {
    const o = ops.find((x) => x.method === 'get' && x.queryParams.length) ?? ops[0]!
    const a = await pool.get(callerFor(o))
    const res = await a.agent.get(`${urlOf(o)}?q=${'x'.repeat(1_000_000)}`)
    expect(res.status).toBe(431)
  })

  it('refuses mistyped, oversized and missing uploads with 4xx problem details and writes nothing', async () => {
    const uploads = ops.filter((o) => o.upload)
    const failures: string[] = []
    let tried = 0
    for (const o of uploads) await pool.get(callerFor(o))
    const before = await fingerprint(t.orm)
    for (const o of uploads) {
      const up = o.upload!
      const who = callerFor(o)
      const allowedType = up.types[0] ?? 'application/octet-stream'
      const cases: { name: string; file?: { buf: Buffer; filename: string; contentType: string }; fieldName?: string; expect?: number[] }[] = [
        { name: 'no file', expect: undefined },
        {
          name: 'executable declared as such',
          file: { buf: Buffer.from('MZ\x90\x00fake-executable'), filename: 'report.exe', contentType: 'application/x-msdownload' },
        },
        { name: 'HTML declared as text/html', file: { buf: Buffer.from('<script>alert(1)</script>'), filename: 'report.html', contentType: 'text/html' } },
        {
          name: `oversized (${up.maxBytes + 1} bytes)`,
          file: { buf: Buffer.alloc(up.maxBytes + 1, 0x41), filename: `big.${allowedType.split('/')[1] ?? 'bin'}`, contentType: allowedType },
          expect: [413],
        },
        {
          name: 'file under another field name',
          file: { buf: Buffer.from('a,b\n1,2\n'), filename: 'x.csv', contentType: allowedType },
          fieldName: 'notTheField',
        },
        { name: 'traversal in the file name', file: { buf: Buffer.from('MZ'), filename: '../../etc/passwd', contentType: 'application/x-msdownload' } },
      ]
      for (const c of cases) {
        const a = await pool.get(who)
        let req = call(a.agent, o.method, urlOf(o)).set('x-csrf-token', a.csrf)
        if (c.file) req = req.attach(c.fieldName ?? up.field, c.file.buf, { filename: c.file.filename, contentType: c.file.contentType })
        else req = req.field('note', 'no file here')
        const res = await req
        tried++
        const what = `${label(o)} as ${who}: ${c.name} → ${res.status}`
        if (res.status < 400 || res.status >= 500) failures.push(`${what} ${String(res.body?.detail ?? '')}`)
        else {
          if (c.expect && !c.expect.includes(res.status)) failures.push(`${what}, expected ${c.expect.join('/')}`)
          try {
            expectProblem(res, what)
          } catch (e) {
            failures.push(`${what}: not problem details (${(e as Error).message.split('\n')[0]})`)
          }
        }
      }
    }
    console.info(`uploads: ${tried} bad uploads over ${uploads.length} operations`)
    expect(failures).toEqual([])
    expect(await fingerprint(t.orm)).toEqual(before)
  }, 300_000)

  it('path traversal in free-text body fields is stored as text or refused, never used as a path', async () => {
    // A free-text field may legitimately hold "../../etc/passwd"; what matters is that it is never
    // resolved as a file: no 5xx, no file content in the answer. This case may write, so it runs last.
    const failures: string[] = []
    let tried = 0
    for (const o of ops.filter((x) => x.jsonBody && x.method !== 'get')) {
      const root = o.jsonBody as JsonSchema
      const props = (mainBranch(root, root).properties ?? {}) as Record<string, JsonSchema>
      const base = exampleOf(root, root) as Record<string, unknown>
      for (const [name, p] of Object.entries(props)) {
        if (typeOf(deref(p, root), root) !== 'string') continue
        const who = callerFor(o)
        const a = await pool.get(who)
        const res = await call(a.agent, o.method, urlOf(o))
          .set('x-csrf-token', a.csrf)
          .send({ ...base, [name]: TRAVERSAL })
        tried++
        if (res.status >= 500) failures.push(`${label(o)} as ${who}: traversal in ${name} → ${res.status} ${String(res.body?.detail ?? '')}`)
        if (PASSWD_LEAK.test(res.text ?? '')) failures.push(`${label(o)}: traversal in ${name} leaked /etc/passwd`)
        if (o.unsafe) await pool.heal(who)
      }
    }
    console.info(`traversal in string fields: ${tried} requests`)
    expect(failures).toEqual([])
  }, 300_000)
})
