import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { CustomerSchema } from '#server/modules/customers/customer.entity.ts'
import type { CustomerInput } from '#shared/schemas/customer.ts'
import { createTestApp, type SignedInAgent, type TestApp } from '#tests/support/test-app.ts'

let t: TestApp
let sales: SignedInAgent

const input = (patch: Partial<CustomerInput> = {}): CustomerInput => ({
  code: 'heron',
  company: 'Heronsgate Brewing Co-operative',
  contactName: 'Ada Merrow',
  contactEmail: 'Brewing@Heronsgate.test',
  phone: '+00 555 0111',
  billingAddress: '2 Malt Yard\nHeronsgate',
  ...patch,
})
const post = (a: SignedInAgent, body: unknown) =>
  a.agent
    .post('/api/customers')
    .set('x-csrf-token', a.csrf)
    .send(body as object)
const fieldsOf = (body: { errors?: { field: string }[] }) => (body.errors ?? []).map((e) => e.field)

beforeAll(async () => {
  t = await createTestApp()
  sales = await t.signIn('sales')
})
afterAll(async () => {
  await t.close()
})

describe('customers', () => {
  it('lists the demo customers for the sales desk and searches them', async () => {
    const all = await sales.agent.get('/api/customers').expect(200)
    expect(all.body.items.map((c: { code: string }) => c.code).sort()).toEqual(['ALDB', 'BRWS', 'CRVF', 'DNMR'])
    const q = await sales.agent.get('/api/customers?q=welding').expect(200)
    expect(q.body.items.map((c: { code: string }) => c.code)).toEqual(['BRWS'])
  })

  it('creates a customer (code upper-cased, e-mail lower-cased) and edits it', async () => {
    const created = await post(sales, input()).expect(201)
    expect(created.body).toMatchObject({ code: 'HERON', contactEmail: 'brewing@heronsgate.test', company: 'Heronsgate Brewing Co-operative' })
    const edited = await sales.agent
      .put(`/api/customers/${created.body.id}`)
      .set('x-csrf-token', sales.csrf)
      .send(input({ contactName: 'Bram Merrow' }))
      .expect(200)
    expect(edited.body.contactName).toBe('Bram Merrow')
    expect((await sales.agent.get(`/api/customers/${created.body.id}`).expect(200)).body.contactName).toBe('Bram Merrow')
  })

  it('answers 400 naming the field, 409 for a code already used, and writes nothing', async () => {
    const before = await t.orm.em.fork().count(CustomerSchema, {})
    expect(fieldsOf((await post(sales, input({ code: 'X2', contactEmail: 'not-an-address' })).expect(400)).body)).toContain('contactEmail')
    expect(fieldsOf((await post(sales, input({ code: 'bad code!' })).expect(400)).body)).toContain('code')
    expect(fieldsOf((await post(sales, { ...input({ code: 'X3' }), paymentProviderId: 'cus_1' }).expect(400)).body)).toContain('(root)')
    const dup = await post(sales, input({ code: 'aldb' })).expect(409)
    expect(fieldsOf(dup.body)).toContain('code')
    expect(await t.orm.em.fork().count(CustomerSchema, {})).toBe(before)
  })

  it('is for the sales desk and admin only', async () => {
    for (const role of ['blender', 'technician', 'qa', 'customer'] as const) {
      const a = await t.signIn(role)
      await a.agent.get('/api/customers').expect(403)
      await post(a, input({ code: `R${role.length}` })).expect(403)
    }
    const admin = await t.signIn('admin')
    await admin.agent.get('/api/customers').expect(200)
  })

  it('answers 404 for an unknown customer', async () => {
    await sales.agent.get('/api/customers/99999').expect(404)
    await sales.agent
      .put('/api/customers/99999')
      .set('x-csrf-token', sales.csrf)
      .send(input({ code: 'NOPE' }))
      .expect(404)
  })
})
