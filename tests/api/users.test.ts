import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createTestApp, DEMO_PASSWORD, type TestApp } from '#tests/support/test-app.ts'

let t: TestApp
beforeAll(async () => {
  t = await createTestApp()
})
afterAll(async () => {
  await t.close()
})

describe('accounts (admin)', () => {
  it('creates a staff account that can sign in, and records it in the audit trail', async () => {
    const { agent, csrf } = await t.signIn('admin')
    const created = await agent
      .post('/api/users')
      .set('x-csrf-token', csrf)
      .send({ email: 'new.blender@demo.test', name: 'New Blender', roles: ['blender', 'qa'], customerId: null, password: 'a-long-first-password' })
      .expect(201)
    expect(created.body.roles).toEqual(['blender', 'qa'])
    const other = await t.anonymous()
    const login = await other.agent
      .post('/api/auth/login')
      .set('x-csrf-token', other.csrf)
      .send({ email: 'new.blender@demo.test', password: 'a-long-first-password' })
      .expect(200)
    expect(login.body.user.roles).toEqual(['blender', 'qa'])
    const audit = await agent.get('/api/audit').query({ entityType: 'user' }).expect(200)
    expect(audit.body.items.some((e: { action: string }) => e.action === 'user.created')).toBe(true)
  })

  it('refuses a customer account without a customer, naming the field', async () => {
    const { agent, csrf } = await t.signIn('admin')
    const res = await agent
      .post('/api/users')
      .set('x-csrf-token', csrf)
      .send({ email: 'c2@demo.test', name: 'C', roles: ['customer'], customerId: null, password: 'a-long-first-password' })
      .expect(400)
    expect(res.body.errors.map((e: { field: string }) => e.field)).toContain('customerId')
  })

  it('a deactivated account is signed out at its next request and cannot sign in', async () => {
    const admin = await t.signIn('admin')
    const qa = await t.signIn('qa')
    const list = await admin.agent.get('/api/users').expect(200)
    const qaUser = list.body.items.find((u: { email: string }) => u.email === 'qa@demo.test')
    await admin.agent
      .put(`/api/users/${qaUser.id}`)
      .set('x-csrf-token', admin.csrf)
      .send({ name: qaUser.name, roles: ['qa'], customerId: null, active: false })
      .expect(200)
    await qa.agent.get('/api/auth/me').expect(401)
    const again = await t.anonymous()
    await again.agent.post('/api/auth/login').set('x-csrf-token', again.csrf).send({ email: 'qa@demo.test', password: DEMO_PASSWORD }).expect(401)
    await admin.agent
      .put(`/api/users/${qaUser.id}`)
      .set('x-csrf-token', admin.csrf)
      .send({ name: qaUser.name, roles: ['qa'], customerId: null, active: true })
      .expect(200)
  })

  it('only admins manage accounts', async () => {
    for (const role of ['sales', 'blender', 'technician', 'qa', 'customer'] as const) {
      const { agent } = await t.signIn(role)
      await agent.get('/api/users').expect(403)
    }
  })

  it('changing your own password needs the current one', async () => {
    const { agent, csrf } = await t.signIn('sales')
    await agent.post('/api/auth/password').set('x-csrf-token', csrf).send({ currentPassword: 'wrong', newPassword: 'another-long-password' }).expect(403)
    await agent.post('/api/auth/password').set('x-csrf-token', csrf).send({ currentPassword: DEMO_PASSWORD, newPassword: 'another-long-password' }).expect(200)
    const again = await t.anonymous()
    await again.agent.post('/api/auth/login').set('x-csrf-token', again.csrf).send({ email: 'sales@demo.test', password: 'another-long-password' }).expect(200)
  })
})
