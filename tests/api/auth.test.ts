import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ROLES } from '#shared/schemas/auth.ts'
import { createTestApp, DEMO_PASSWORD, type TestApp } from '#tests/support/test-app.ts'

let t: TestApp
beforeAll(async () => {
  t = await createTestApp()
})
afterAll(async () => {
  await t.close()
})

describe('sign-in contract', () => {
  it.each(ROLES)('%s@demo.test signs in and /api/auth/me shows the role', async (role) => {
    const { agent } = await t.signIn(role)
    const me = await agent.get('/api/auth/me').expect(200)
    expect(me.body.email).toBe(`${role}@demo.test`)
    expect(me.body.roles).toContain(role)
  })

  it('answers 401 without saying which part was wrong', async () => {
    const { agent, csrf } = await t.anonymous()
    const wrongPassword = await agent.post('/api/auth/login').set('x-csrf-token', csrf).send({ email: 'qa@demo.test', password: 'nope' }).expect(401)
    const noAccount = await agent.post('/api/auth/login').set('x-csrf-token', csrf).send({ email: 'nobody@demo.test', password: 'nope' }).expect(401)
    expect(wrongPassword.body.detail).toBe(noAccount.body.detail)
  })

  it('refuses unsafe methods without the CSRF token (403)', async () => {
    const { agent } = await t.anonymous()
    await agent.post('/api/auth/login').send({ email: 'qa@demo.test', password: DEMO_PASSWORD }).expect(403)
  })

  it('is 401 when signed out and after sign-out', async () => {
    const { agent, csrf } = await t.signIn('sales')
    await agent.get('/api/auth/me').expect(200)
    await agent.post('/api/auth/logout').set('x-csrf-token', csrf).expect(200)
    await agent.get('/api/auth/me').expect(401)
  })

  it('regenerates the session id at sign-in', async () => {
    const { agent, csrf } = await t.anonymous()
    const before = await agent.get('/api/auth/csrf')
    const cookieBefore = String(before.headers['set-cookie'] ?? '')
    const login = await agent.post('/api/auth/login').set('x-csrf-token', csrf).send({ email: 'qa@demo.test', password: DEMO_PASSWORD }).expect(200)
    const cookieAfter = String(login.headers['set-cookie'] ?? '')
    expect(cookieAfter).toMatch(/fillwright\.sid=/)
    expect(cookieAfter.split(';')[0]).not.toBe(cookieBefore.split(';')[0])
    expect(cookieAfter).toMatch(/HttpOnly/i)
    expect(cookieAfter).toMatch(/SameSite=Lax/i)
  })

  it('rate-limits wrong passwords: 429 after 10 failures for one account', async () => {
    const fresh = await createTestApp()
    const { agent, csrf } = await fresh.anonymous()
    const statuses: number[] = []
    for (let i = 0; i < 11; i++) {
      const r = await agent
        .post('/api/auth/login')
        .set('x-csrf-token', csrf)
        .send({ email: 'technician@demo.test', password: `wrong-${i}` })
      statuses.push(r.status)
    }
    expect(statuses.slice(0, 10).every((s) => s === 401)).toBe(true)
    expect(statuses[10]).toBe(429)
    // the right password is refused too while the account is locked out
    await agent.post('/api/auth/login').set('x-csrf-token', csrf).send({ email: 'technician@demo.test', password: DEMO_PASSWORD }).expect(429)
    await fresh.close()
  })

  it('rejects malformed JSON and unknown fields with problem details', async () => {
    const { agent, csrf } = await t.anonymous()
    const bad = await agent.post('/api/auth/login').set('x-csrf-token', csrf).set('content-type', 'application/json').send('{"email": ').expect(400)
    expect(bad.body.title).toBeDefined()
    const unknown = await agent.post('/api/auth/login').set('x-csrf-token', csrf).send({ email: 'qa@demo.test', password: 'x', admin: true }).expect(400)
    expect(unknown.body.errors?.length).toBeGreaterThan(0)
  })

  it('answers 413 for an oversized body', async () => {
    const { agent, csrf } = await t.anonymous()
    await agent
      .post('/api/auth/login')
      .set('x-csrf-token', csrf)
      .send({ email: 'qa@demo.test', password: 'x'.repeat(1_100_000) })
      .expect(413)
  })
})

describe('health and API description', () => {
  it('GET /api/health answers', async () => {
    const res = await (await t.anonymous()).agent.get('/api/health').expect(200)
    expect(res.body.status).toBe('ok')
  })

  it('every non-public operation in /api/openapi.json answers 401 when signed out', async () => {
    const { agent, csrf } = await t.anonymous()
    const doc = (await agent.get('/api/openapi.json').expect(200)).body as { paths: Record<string, Record<string, { 'x-roles': string[] }>> }
    let checked = 0
    for (const [path, ops] of Object.entries(doc.paths)) {
      for (const [method, op] of Object.entries(ops)) {
        if (op['x-roles'].length === 0) continue
        const url = path.replace(/\{[^}]+\}/g, '1')
        const res = await (agent as unknown as Record<string, (u: string) => { set: (k: string, v: string) => Promise<{ status: number }> }>)
          [method](url)
          .set('x-csrf-token', csrf)
        expect(res.status, `${method.toUpperCase()} ${path}`).toBe(401)
        checked++
      }
    }
    expect(checked).toBeGreaterThan(0)
  })
})
