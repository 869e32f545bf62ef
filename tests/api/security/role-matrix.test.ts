import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Role } from '#shared/schemas/auth.ts'
import { createTestApp, type TestApp } from '#tests/support/test-app.ts'
import { ALL_ROLES, AgentPool, call, expectProblem, label, loadOperations, type Operation, urlOf } from './openapi-support.ts'

/**
 * The role matrix, generated from GET /api/openapi.json: every operation × every role and signed out.
 * Signed out → 401 for non-public operations; a role not in `x-roles` → 403; an allowed role is never
 * refused (no 401/403) and never gets a 500, whatever the dummy input does. Path parameters are 1.
 */

let t: TestApp
let ops: Operation[]
let pool: AgentPool

beforeAll(async () => {
  t = await createTestApp()
  ops = await loadOperations(t)
  pool = new AgentPool(t)
})
afterAll(async () => {
  await t?.close()
})

// Operations that change data run last, deletions very last, so that an allowed DELETE on record 1
// cannot take away what a later check relies on (the matrix checks the guard, not the business rules).
const ORDER: Record<string, number> = { get: 0, post: 1, put: 1, patch: 1, delete: 2 }

describe('role matrix from /api/openapi.json', () => {
  it('covers every operation × every role and signed out', async () => {
    expect(ops.length).toBeGreaterThan(3)
    const sorted = [...ops].sort((a, b) => (ORDER[a.method] ?? 1) - (ORDER[b.method] ?? 1))
    let checked = 0
    const failures: string[] = []
    const serverErrors: string[] = []

    for (const o of sorted) {
      const url = urlOf(o)
      // signed out (with a valid CSRF token, so the guard — not the CSRF check — answers)
      const anon = await pool.get('anonymous')
      const r0 = await call(anon.agent, o.method, url)
        .set('x-csrf-token', anon.csrf)
        .send(o.jsonBody ? {} : undefined)
      checked++
      if (r0.status >= 500) serverErrors.push(`${label(o)} signed out → ${r0.status}`)
      if (!o.isPublic) {
        if (r0.status !== 401) failures.push(`${label(o)} signed out → ${r0.status}, expected 401`)
        else expectProblem(r0, `${label(o)} signed out`)
      } else if (r0.status === 401 || r0.status === 403) failures.push(`${label(o)} (public) signed out → ${r0.status}`)
      if (o.unsafe) await pool.heal('anonymous')

      for (const role of ALL_ROLES) {
        const a = await pool.get(role)
        const res = await call(a.agent, o.method, url)
          .set('x-csrf-token', a.csrf)
          .send(o.jsonBody ? {} : undefined)
        checked++
        const allowed = o.isPublic || o.roles.includes(role as Role)
        if (res.status >= 500) serverErrors.push(`${label(o)} as ${role} → ${res.status}: ${res.body?.detail ?? ''}`)
        if (allowed) {
          if (res.status === 401 || res.status === 403) failures.push(`${label(o)} as ${role} (allowed) → ${res.status}: ${res.body?.detail ?? ''}`)
        } else if (res.status !== 403) {
          failures.push(`${label(o)} as ${role} (not in x-roles ${JSON.stringify(o.roles)}) → ${res.status}, expected 403`)
        } else expectProblem(res, `${label(o)} as ${role}`)
        if (o.unsafe) await pool.heal(role)
      }
    }
    console.info(`role matrix: ${ops.length} operations × (${ALL_ROLES.length} roles + signed out) = ${checked} checks`)
    expect(serverErrors, 'no 5xx for any role').toEqual([])
    expect(failures).toEqual([])
    expect(checked).toBe(ops.length * (ALL_ROLES.length + 1))
  }, 600_000)

  it('every operation declares x-roles drawn from the known roles', () => {
    for (const o of ops) for (const r of o.roles) expect(ALL_ROLES, `${label(o)} x-roles`).toContain(r)
  })

  it('only sign-in, CSRF token, health, API description and signed webhooks are public', () => {
    const allowedPublic = [
      /^\/api\/auth\/(login|csrf)$/,
      /^\/api\/health$/,
      /^\/api\/openapi\.json$/,
      /^\/api\/payments\/webhook$/,
      /^\/api\/auth\/(password-reset|reset-password|forgot-password)/,
    ]
    // openapi.json itself is not a defineRoute operation; list the public ones for review
    const publicOps = ops.filter((o) => o.isPublic).map(label)
    const unexpected = ops.filter((o) => o.isPublic && !allowedPublic.some((re) => re.test(o.path))).map(label)
    console.info(`public operations: ${publicOps.join(', ')}`)
    expect(unexpected, 'public operations outside the reviewed list').toEqual([])
  })
})
