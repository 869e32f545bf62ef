import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { CylinderSchema } from '#server/modules/cylinders/cylinder.entity.ts'
import { OrderLineSchema, OrderSchema } from '#server/modules/orders/order.entity.ts'
import { UserSchema } from '#server/modules/users/user.entity.ts'
import { PlanDetailSchema, PlanListSchema, PlanQueueSchema } from '#shared/schemas/plan.ts'
import { createTestApp, type SignedInAgent, type TestApp } from '#tests/support/test-app.ts'

let t: TestApp
let blender: SignedInAgent
let m21LineId: number
let m21OrderId: number
let draftLineId: number
let technicianId: number
let cylinders: Record<string, number>

beforeAll(async () => {
  t = await createTestApp()
  blender = await t.signIn('blender')
  const em = t.orm.em.fork()
  // the demo seed's accepted order is Ar + 18 % CO2 (M21), 50 L cylinders at 200 bar gauge
  const accepted = await em.find(OrderSchema, { status: 'accepted' })
  const lines = await em.find(OrderLineSchema, { order: { $in: accepted.map((o) => o.id) } })
  const m21 = lines.find((l) => l.balanceGas === 'argon' && l.components.some((c) => c.gas === 'carbon-dioxide' && Math.abs(c.fraction - 0.18) < 1e-9))
  if (!m21) throw new Error('the demo seed has no accepted M21 order line')
  m21LineId = m21.id
  m21OrderId = m21.order.id
  const drafts = await em.find(OrderSchema, { status: 'draft' })
  draftLineId = (await em.findOneOrFail(OrderLineSchema, { order: { $in: drafts.map((o) => o.id) } })).id
  technicianId = (await em.findOneOrFail(UserSchema, { email: 'technician@demo.test' })).id
  const all = await em.find(CylinderSchema, {}, { orderBy: { id: 'asc' } })
  cylinders = Object.fromEntries(all.map((c) => [c.serial, c.id]))
  const today = new Date().toISOString().slice(0, 10)
  // free 50 L cylinders: not booked by the demo runs, evacuated, in test
  FREE_50L = all
    .filter(
      (c) => c.waterVolumeL === 50 && c.servicePressureBar >= 200 && c.status === 'available' && c.residual.kind === 'evacuated' && c.nextTestDate >= today,
    )
    .map((c) => c.serial)
  if (FREE_50L.length < 4) throw new Error(`the demo seed leaves only ${FREE_50L.length} free 50 L cylinders`)
})
afterAll(async () => {
  await t.close()
})

const post = (who: SignedInAgent, path: string, body: unknown) =>
  who.agent
    .post(path)
    .set('x-csrf-token', who.csrf)
    .send(body as object)

function expectNear(actual: number, expected: number, tolerance: number, what: string) {
  expect(Math.abs(actual - expected), `${what}: expected ${expected} ± ${tolerance}, got ${actual}`).toBeLessThanOrEqual(tolerance)
}

/** serials of free 50 L, 200 bar cylinders of the demo seed */
let FREE_50L: string[] = []

describe('stored plans: compute on the server, version, approve', () => {
  let v1: { id: number; version: number }
  let v2: { id: number; version: number }

  it('computes a plan from the order line and cylinder on the server (ideal gas: Dalton targets)', async () => {
    const res = await post(blender, '/api/plans', {
      orderLineId: m21LineId,
      cylinderId: cylinders[FREE_50L[0]],
      options: { model: 'ideal', minimumTemperature: { value: 0, unit: 'C' } },
    }).expect(201)
    // the answer is the declared wire shape
    PlanDetailSchema.parse(res.body)
    expect(res.body.planVersion).toBe(1)
    expect(res.body.status).toBe('draft')
    expect(res.body.cylinderSerial).toBe(FREE_50L[0])
    // the line says 200 bar gauge settled at 15 °C; with the standard atmosphere (101.325 kPa = 1.01325 bar, exact by
    // definition) that is 201.01325 bar absolute, and the ideal-gas CO2 step is Dalton's x·p = 0.18 × 201.01325 bar
    // absolute (ISO 6146 ideal-gas limit, DOMAIN §2.2)
    const steps = res.body.result.steps
    expectNear(steps[steps.length - 1].cumulativeGaugePressure.value, 200, 1e-6, 'final gauge target')
    expectNear(steps[0].cumulativePressure.value, 0.18 * 201.01325, 1e-6, 'CO2 step, absolute')
    expect(res.body.request.finalPressure).toEqual({ value: 200, unit: 'bar', reference: 'gauge' })
    v1 = { id: res.body.id, version: res.body.version }
  })

  it('a new computation is the next version and supersedes the previous one', async () => {
    const res = await post(blender, '/api/plans', {
      orderLineId: m21LineId,
      cylinderId: cylinders[FREE_50L[0]],
      options: { model: 'gerg-2008', minimumTemperature: { value: 0, unit: 'C' } },
    }).expect(201)
    expect(res.body.planVersion).toBe(2)
    expect(res.body.model).toBe('gerg-2008')
    v2 = { id: res.body.id, version: res.body.version }
    const list = await blender.agent.get(`/api/plans?orderLineId=${m21LineId}`).expect(200)
    PlanListSchema.parse(list.body)
    const byId = new Map(list.body.items.map((p: { id: number; status: string }) => [p.id, p.status]))
    expect(byId.get(v1.id)).toBe('superseded')
    expect(byId.get(v2.id)).toBe('draft')
  })

  it('the blender queue lists the accepted order and the draft awaiting approval', async () => {
    const q = await blender.agent.get('/api/plans/queue').expect(200)
    PlanQueueSchema.parse(q.body)
    const order = q.body.ordersNeedingPlan.find((o: { orderId: number }) => o.orderId === m21OrderId)
    expect(order.lines.find((l: { id: number }) => l.id === m21LineId).planState).toBe('draft')
    expect(q.body.awaitingApproval.map((p: { id: number }) => p.id)).toContain(v2.id)
  })

  it('approving a superseded version is 409', async () => {
    const res = await post(blender, `/api/plans/${v1.id}/approve`, { version: v1.version })
    expect(res.status).toBe(409)
  })

  it('approving with a stale version is 409 and changes nothing', async () => {
    const res = await post(blender, `/api/plans/${v2.id}/approve`, { version: v2.version + 7 })
    expect(res.status).toBe(409)
    const after = await blender.agent.get(`/api/plans/${v2.id}`).expect(200)
    expect(after.body.status).toBe('draft')
  })

  it('approves the current version; the one-line order becomes planned', async () => {
    const res = await post(blender, `/api/plans/${v2.id}/approve`, { version: v2.version }).expect(200)
    PlanDetailSchema.parse(res.body)
    expect(res.body.status).toBe('approved')
    expect(res.body.approvedBy).toBeTruthy()
    const em = t.orm.em.fork()
    expect((await em.findOneOrFail(OrderSchema, { id: m21OrderId })).status).toBe('planned')
    const q = await blender.agent.get('/api/plans/queue').expect(200)
    expect(q.body.ordersNeedingPlan.map((o: { orderId: number }) => o.orderId)).not.toContain(m21OrderId)
  })

  it('the fill sheet is a PDF', async () => {
    const res = await blender.agent
      .get(`/api/plans/${v2.id}/fill-sheet.pdf`)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = []
        r.on('data', (c: Buffer) => chunks.push(c))
        r.on('end', () => cb(null, Buffer.concat(chunks)))
      })
    expect(res.status).toBe(200)
    expect(res.headers['content-type']).toMatch(/application\/pdf/)
    expect((res.body as Buffer).subarray(0, 5).toString('latin1')).toBe('%PDF-')
    const letter = await blender.agent.get(`/api/plans/${v2.id}/fill-sheet.pdf?size=LETTER`)
    expect(letter.status).toBe(200)
    await blender.agent.get(`/api/plans/${v2.id}/fill-sheet.pdf?size=A3`).expect(400)
  })

  it('e-mails the fill sheet to the technician with the PDF attached', async () => {
    const before = t.sentMail.length
    const res = await post(blender, `/api/plans/${v2.id}/email-sheet`, { technicianId }).expect(200)
    expect(res.body.sentTo).toBe('technician@demo.test')
    expect(t.sentMail.length).toBe(before + 1)
    const mail = t.sentMail[t.sentMail.length - 1]
    expect(mail.to).toBe('technician@demo.test')
    expect(mail.attachments?.[0].contentType).toBe('application/pdf')
    expect(mail.attachments?.[0].content.subarray(0, 5).toString('latin1')).toBe('%PDF-')
  })

  it('e-mail to someone who is not a technician is 422 and sends nothing', async () => {
    const em = t.orm.em.fork()
    const sales = await em.findOneOrFail(UserSchema, { email: 'sales@demo.test' })
    const before = t.sentMail.length
    const res = await post(blender, `/api/plans/${v2.id}/email-sheet`, { technicianId: sales.id }).expect(422)
    expect(res.body.errors[0].field).toBe('technicianId')
    expect(t.sentMail.length).toBe(before)
  })

  it('assigns cylinders and a technician: one run per cylinder', async () => {
    const today = new Date().toISOString().slice(0, 10)
    const res = await post(blender, `/api/plans/${v2.id}/assign`, {
      cylinderIds: [cylinders[FREE_50L[1]], cylinders[FREE_50L[2]]],
      technicianId,
      scheduledFor: today,
    }).expect(200)
    expect(res.body.runs.map((r: { cylinderSerial: string }) => r.cylinderSerial).sort()).toEqual([FREE_50L[1], FREE_50L[2]])
    expect(res.body.runs.every((r: { technicianId: number; scheduledFor: string }) => r.technicianId === technicianId && r.scheduledFor === today)).toBe(true)
  })
})

describe('stored plans: refusals', () => {
  it('a blocking finding is stored but cannot be approved (422)', async () => {
    // M21 stored at −10 °C fails the condensation screen (DOMAIN §6.6: the finished cylinder fails below ≈ −5 °C)
    const created = await post(blender, '/api/plans', {
      orderLineId: m21LineId,
      cylinderId: cylinders[FREE_50L[3]],
      options: { model: 'gerg-2008', minimumTemperature: { value: -10, unit: 'C' } },
    }).expect(201)
    expect(created.body.blocking).toBe(true)
    expect(created.body.blockingReason).toBeTruthy()
    const res = await post(blender, `/api/plans/${created.body.id}/approve`, { version: created.body.version }).expect(422)
    expect(res.body.errors.length).toBeGreaterThan(0)
    const after = await blender.agent.get(`/api/plans/${created.body.id}`).expect(200)
    expect(after.body.status).toBe('draft')
  })

  it('an order that is not accepted cannot be planned (422)', async () => {
    const res = await post(blender, '/api/plans', { orderLineId: draftLineId, cylinderId: null, options: { model: 'gerg-2008' } }).expect(422)
    expect(res.body.errors[0].field).toBe('orderLineId')
  })

  it('a cylinder held back for its overdue test cannot be planned (422)', async () => {
    // the seed quarantines the last cylinder of each family (periodic test overdue)
    const res = await post(blender, '/api/plans', { orderLineId: m21LineId, cylinderId: cylinders['KR-S50-1008'], options: { model: 'gerg-2008' } }).expect(422)
    expect(res.body.errors[0].field).toBe('cylinderId')
  })

  it('bad input is 400 naming the field; unknown line is 404', async () => {
    const bad = await post(blender, '/api/plans', { orderLineId: m21LineId, options: { model: 'magic' } }).expect(400)
    expect(bad.body.errors.map((e: { field: string }) => e.field)).toContain('options.model')
    await post(blender, '/api/plans', { orderLineId: 999_999, options: { model: 'gerg-2008' } }).expect(404)
    await blender.agent.get('/api/plans/abc').expect(400)
    await blender.agent.get('/api/plans/999999').expect(404)
  })

  it('roles: technicians read but do not plan; customers see no plans', async () => {
    const tech = await t.signIn('technician')
    await post(tech, '/api/plans', { orderLineId: m21LineId, options: { model: 'gerg-2008' } }).expect(403)
    await tech.agent.get(`/api/plans?orderLineId=${m21LineId}`).expect(200)
    const customer = await t.signIn('customer')
    await customer.agent.get('/api/plans').expect(403)
    await customer.agent.get('/api/plans/queue').expect(403)
    const anon = await t.anonymous()
    await anon.agent.get('/api/plans').expect(401)
  })
})
