import { pino } from 'pino'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '#server/app.ts'
import { initOrm } from '#server/db.ts'
import { hashPassword } from '#server/lib/passwords.ts'
import { CustomerSchema } from '#server/modules/customers/customer.entity.ts'
import { CylinderSchema } from '#server/modules/cylinders/cylinder.entity.ts'
import { OrderLineSchema, OrderSchema } from '#server/modules/orders/order.entity.ts'
import { FillPlanSchema } from '#server/modules/plans/fill-plan.entity.ts'
import { FillReadingSchema, FillRunSchema } from '#server/modules/runs/fill-run.entity.ts'
import { seedRuns } from '#server/modules/runs/runs.seed.ts'
import { UserSchema } from '#server/modules/users/user.entity.ts'
import { fillPlanFromRequest } from '#shared/planning/index.ts'
import { addDaysIso, localIsoDate } from '#shared/schemas/cylinder.ts'
import type { FillPlanRequest } from '#shared/schemas/fill-plan.ts'
import { pressureAtTemperature, type RunDetail } from '#shared/schemas/run.ts'
import { createTestApp, DEMO_PASSWORD, type SignedInAgent, type TestApp } from '#tests/support/test-app.ts'

let t: TestApp
let blender: SignedInAgent
let technician: SignedInAgent
let otherTech: SignedInAgent
let technicianId: number
let otherTechId: number
let seq = 0
const today = localIsoDate()

/** Ar + 10 % CO2 at 150 bar (gauge, 15 °C) in 50 L, CO2 first, ±2 % relative blend tolerance. */
function planRequest(): FillPlanRequest {
  return {
    target: [
      { gas: 'carbon-dioxide', fraction: 0.1 },
      { gas: 'argon', fraction: 0.9, balance: true },
    ],
    finalPressure: { value: 150, unit: 'bar', reference: 'gauge' },
    referenceTemperature: { value: 15, unit: 'C' },
    fillTemperature: { value: 15, unit: 'C' },
    cylinder: {
      waterVolume: { value: 50, unit: 'L' },
      servicePressure: { value: 200, unit: 'bar', reference: 'gauge' },
      testPressure: { value: 300, unit: 'bar', reference: 'gauge' },
      residual: { kind: 'evacuated' },
    },
    sources: [{ gas: 'carbon-dioxide' }, { gas: 'argon' }],
    order: 'as-given',
    model: 'peng-robinson',
    method: 'partial-pressure',
    blendTolerancePercent: 2,
    proposePremix: false,
  }
}

/** An order in 'planned' with one line of `quantity` cylinders and an approved plan for it. */
async function approvedPlan(quantity = 1): Promise<{ planId: number; orderId: number }> {
  const em = t.orm.em.fork()
  const customer = await em.findOneOrFail(CustomerSchema, { code: 'BRWS' })
  const order = em.create(OrderSchema, { number: `T-RUN-${++seq}`, customer, status: 'planned' })
  const line = em.create(OrderLineSchema, {
    order,
    lineNo: 1,
    description: 'Ar + 10 % CO2, test line',
    components: [
      { gas: 'carbon-dioxide', fraction: 0.1 },
      { gas: 'argon', fraction: 0.9 },
    ],
    balanceGas: 'argon',
    blendTolerancePct: 2,
    certificationUncertaintyPct: 5,
    waterVolumeL: 50,
    valveOutlet: 'DIN 477 No. 10',
    quantity,
    finalPressureBarGauge: 150,
    pricing: null,
  })
  const req = planRequest()
  const plan = em.create(FillPlanSchema, {
    orderLine: line,
    cylinder: null,
    planVersion: 1,
    status: 'approved',
    model: req.model,
    method: req.method,
    request: req as unknown as Record<string, unknown>,
    result: fillPlanFromRequest(req) as unknown as Record<string, unknown>,
    blocking: false,
    approvedAt: new Date(),
  })
  await em.flush()
  return { planId: plan.id, orderId: order.id }
}

/** A fresh 50 L, 200 bar cylinder of this test file, its periodic test valid for two more years. */
async function freeCylinder(): Promise<number> {
  const em = t.orm.em.fork()
  const n = ++seq
  const c = em.create(CylinderSchema, {
    serial: `T-RUN-CYL-${n}`,
    barcode: `TRC${String(n).padStart(5, '0')}`,
    waterVolumeL: 50,
    servicePressureBar: 200,
    testPressureBar: 300,
    material: 'steel',
    valveOutlet: 'DIN 477 No. 10',
    oxygenClean: false,
    owner: null,
    lastTestDate: addDaysIso(today, -3 * 365),
    nextTestDate: addDaysIso(today, 2 * 365),
    status: 'available',
    residual: { kind: 'evacuated' },
  })
  await em.flush()
  return c.id
}

async function bookRun(options: { quantity?: number; tech?: number } = {}): Promise<{ runId: number; orderId: number; cylinderId: number }> {
  const { planId, orderId } = await approvedPlan(options.quantity ?? 1)
  const cylinderId = await freeCylinder()
  const res = await blender.agent
    .post('/api/runs')
    .set('x-csrf-token', blender.csrf)
    .send({ planId, cylinderIds: [cylinderId], technicianId: options.tech ?? technicianId, scheduledFor: today })
    .expect(201)
  return { runId: res.body[0].id, orderId, cylinderId }
}

async function detail(agent: SignedInAgent, runId: number): Promise<RunDetail> {
  return (await agent.agent.get(`/api/runs/${runId}`).expect(200)).body as RunDetail
}

let reqCounter = 0
const newRequestId = () => `tablet-a-${Date.now()}-${++reqCounter}`

function reading(run: RunDetail, gaugeBar: number, temperatureC: number, extra: Record<string, unknown> = {}) {
  return {
    stepIndex: run.currentStep,
    pressure: { value: gaugeBar, unit: 'bar', reference: 'gauge' },
    temperature: { value: temperatureC, unit: 'C' },
    clientRequestId: newRequestId(),
    expectedVersion: run.version,
    ...extra,
  }
}

async function signInAs(app: TestApp['app'], email: string): Promise<SignedInAgent> {
  const agent = request.agent(app)
  const csrf = (await agent.get('/api/auth/csrf').expect(200)).body.token as string
  await agent.post('/api/auth/login').set('x-csrf-token', csrf).send({ email, password: DEMO_PASSWORD }).expect(200)
  return { agent, csrf }
}

beforeAll(async () => {
  t = await createTestApp()
  const em = t.orm.em.fork()
  technicianId = (await em.findOneOrFail(UserSchema, { email: 'technician@demo.test' })).id
  const second = em.create(UserSchema, {
    email: 'second-tech@demo.test',
    name: 'Second Technician',
    roles: ['technician'],
    passwordHash: await hashPassword(DEMO_PASSWORD),
    active: true,
    customer: null,
  })
  await em.flush()
  otherTechId = second.id
  blender = await t.signIn('blender')
  technician = await t.signIn('technician')
  otherTech = await signInAs(t.app, 'second-tech@demo.test')
})
afterAll(async () => {
  await t.close()
})

describe('booking runs', () => {
  it('refuses a cylinder past its periodic test date (422 with the reason) and creates nothing', async () => {
    const { planId } = await approvedPlan()
    const em = t.orm.em.fork()
    const overdue = await em.findOneOrFail(CylinderSchema, { waterVolumeL: 50, nextTestDate: { $lt: today } })
    const before = await em.count(FillRunSchema, {})
    const res = await blender.agent
      .post('/api/runs')
      .set('x-csrf-token', blender.csrf)
      .send({ planId, cylinderIds: [overdue.id], technicianId, scheduledFor: today })
      .expect(422)
    expect(res.body.detail).toContain('periodic test date')
    expect(res.body.detail).toContain(overdue.nextTestDate)
    expect(await t.orm.em.fork().count(FillRunSchema, {})).toBe(before)
  })

  it('refuses a cylinder whose test falls due before the fill date', async () => {
    const { planId } = await approvedPlan()
    const em = t.orm.em.fork()
    const c = await em.findOneOrFail(CylinderSchema, { id: await freeCylinder() })
    const dayAfter = addDaysIso(c.nextTestDate, 1)
    await blender.agent
      .post('/api/runs')
      .set('x-csrf-token', blender.csrf)
      .send({ planId, cylinderIds: [c.id], technicianId, scheduledFor: dayAfter })
      .expect(422)
  })

  it('refuses a draft plan, a non-technician, more cylinders than ordered, and technicians booking', async () => {
    const { planId } = await approvedPlan(1)
    const em = t.orm.em.fork()
    const plan = await em.findOneOrFail(FillPlanSchema, { id: planId })
    plan.status = 'draft'
    await em.flush()
    const cyl = await freeCylinder()
    await blender.agent
      .post('/api/runs')
      .set('x-csrf-token', blender.csrf)
      .send({ planId, cylinderIds: [cyl], technicianId, scheduledFor: today })
      .expect(422)
    plan.status = 'approved'
    await em.flush()
    const blenderUser = await em.findOneOrFail(UserSchema, { email: 'blender@demo.test' })
    await blender.agent
      .post('/api/runs')
      .set('x-csrf-token', blender.csrf)
      .send({ planId, cylinderIds: [cyl], technicianId: blenderUser.id, scheduledFor: today })
      .expect(422)
    await blender.agent
      .post('/api/runs')
      .set('x-csrf-token', blender.csrf)
      .send({ planId, cylinderIds: [cyl, await freeCylinder()], technicianId, scheduledFor: today })
      .expect(422)
    await technician.agent
      .post('/api/runs')
      .set('x-csrf-token', technician.csrf)
      .send({ planId, cylinderIds: [cyl], technicianId, scheduledFor: today })
      .expect(403)
  })

  it('books the cylinder (reserved) and shows the run in "my fills today" and by barcode', async () => {
    const { runId, cylinderId } = await bookRun()
    const c = await t.orm.em.fork().findOneOrFail(CylinderSchema, { id: cylinderId })
    expect(c.status).toBe('reserved')
    const mine = await technician.agent.get('/api/runs/mine').expect(200)
    expect(mine.body.map((r: { id: number }) => r.id)).toContain(runId)
    const found = await technician.agent.get('/api/runs/lookup').query({ barcode: c.barcode }).expect(200)
    expect(found.body.id).toBe(runId)
    await otherTech.agent.get('/api/runs/lookup').query({ barcode: c.barcode }).expect(404)
    const theirs = await otherTech.agent.get('/api/runs/mine').expect(200)
    expect(theirs.body.map((r: { id: number }) => r.id)).not.toContain(runId)
    // the same cylinder cannot be booked twice
    const { planId } = await approvedPlan()
    await blender.agent
      .post('/api/runs')
      .set('x-csrf-token', blender.csrf)
      .send({ planId, cylinderIds: [cylinderId], technicianId, scheduledFor: today })
      .expect(409)
  })
})

describe('the run at the manifold', () => {
  it('carries the plan steps with targets, window and temperature table', async () => {
    const { runId } = await bookRun()
    const run = await detail(technician, runId)
    const plan = fillPlanFromRequest(planRequest())
    expect(run.steps).toHaveLength(plan.steps.length)
    expect(run.steps[0].gas).toBe('carbon-dioxide')
    expect(run.steps[0].formula).toBe('CO2')
    expect(run.steps[0].cumulativeGaugePressure.value).toBeCloseTo(plan.steps[0].cumulativeGaugePressure.value, 9)
    expect(run.steps[0].cumulativePressure.reference).toBe('absolute')
    expect(run.steps[0].temperatureTable.length).toBeGreaterThan(1)
    expect(run.steps[0].toleranceWindow.gaugePressureLow?.value).toBeLessThan(run.steps[0].cumulativeGaugePressure.value)
    expect(run.steps[0].toleranceWindow.gaugePressureHigh.value).toBeGreaterThan(run.steps[0].cumulativeGaugePressure.value)
    expect(run.steps[0].cautions.map((c) => c.kind)).toContain('pressure')
    expect(run.steps[0].state).toBe('current')
    expect(run.canRecord).toBe(true)
  })

  it('records an on-target reading immediately: next step, cylinder filling, order at the manifold', async () => {
    const { runId, orderId, cylinderId } = await bookRun()
    const run = await detail(technician, runId)
    const res = await technician.agent
      .post(`/api/runs/${runId}/readings`)
      .set('x-csrf-token', technician.csrf)
      .send(reading(run, run.steps[0].cumulativeGaugePressure.value, run.fillTemperature.value))
      .expect(201)
    expect(res.body.replayed).toBe(false)
    expect(res.body.reading.outcome).toBe('on-target')
    expect(res.body.run.currentStep).toBe(1)
    expect(res.body.run.status).toBe('in-progress')
    expect(res.body.run.version).toBe(run.version + 1)
    const em = t.orm.em.fork()
    expect((await em.findOneOrFail(CylinderSchema, { id: cylinderId })).status).toBe('filling')
    expect((await em.findOneOrFail(OrderSchema, { id: orderId })).status).toBe('filling')
  })

  it('judges a reading at the measured temperature (constant density)', async () => {
    const { runId } = await bookRun()
    const run = await detail(technician, runId)
    const step = run.steps[0]
    const warm = step.temperatureTable.reduce((a, b) => (b.temperature.value > a.temperature.value ? b : a))
    expect(warm.temperature.value).toBeGreaterThan(run.fillTemperature.value)
    // the pressure the step's gas shows when warm is above the window at fill temperature …
    expect(warm.gaugePressure.value).toBeGreaterThan(step.toleranceWindow.gaugePressureHigh.value)
    // … and on target at the warm temperature it was read at
    const res = await technician.agent
      .post(`/api/runs/${runId}/readings`)
      .set('x-csrf-token', technician.csrf)
      .send(reading(run, warm.gaugePressure.value, warm.temperature.value))
      .expect(201)
    expect(res.body.reading.outcome).toBe('on-target')
  })

  it('is idempotent by clientRequestId: a retry returns the first answer and records nothing new', async () => {
    const { runId } = await bookRun()
    const run = await detail(technician, runId)
    const body = reading(run, run.steps[0].cumulativeGaugePressure.value, 15)
    const first = await technician.agent.post(`/api/runs/${runId}/readings`).set('x-csrf-token', technician.csrf).send(body).expect(201)
    const retry = await technician.agent.post(`/api/runs/${runId}/readings`).set('x-csrf-token', technician.csrf).send(body).expect(201)
    expect(retry.body.replayed).toBe(true)
    expect(retry.body.reading.id).toBe(first.body.reading.id)
    expect(retry.body.run.currentStep).toBe(1)
    expect(await t.orm.em.fork().count(FillReadingSchema, { run: runId })).toBe(1)
  })

  it('answers a stale expectedVersion with 409 and the current state', async () => {
    const { runId } = await bookRun()
    const run = await detail(technician, runId)
    await technician.agent
      .post(`/api/runs/${runId}/readings`)
      .set('x-csrf-token', technician.csrf)
      .send(reading(run, run.steps[0].cumulativeGaugePressure.value, 15))
      .expect(201)
    const stale = await technician.agent
      .post(`/api/runs/${runId}/readings`)
      .set('x-csrf-token', technician.csrf)
      .send(reading(run, run.steps[0].cumulativeGaugePressure.value, 15))
      .expect(409)
    expect(stale.body.current.version).toBe(run.version + 1)
    expect(stale.body.current.currentStep).toBe(1)
    expect(await t.orm.em.fork().count(FillReadingSchema, { run: runId })).toBe(1)
  })

  it('lets one of two tablets recording the same step win; the other gets 409', async () => {
    const { runId } = await bookRun()
    const run = await detail(technician, runId)
    const target = run.steps[0].cumulativeGaugePressure.value
    const [a, b] = await Promise.all([
      technician.agent
        .post(`/api/runs/${runId}/readings`)
        .set('x-csrf-token', technician.csrf)
        .send(reading(run, target, 15)),
      blender.agent
        .post(`/api/runs/${runId}/readings`)
        .set('x-csrf-token', blender.csrf)
        .send(reading(run, target, 15)),
    ])
    expect([a.status, b.status].sort()).toEqual([201, 409])
    expect(await t.orm.em.fork().count(FillReadingSchema, { run: runId })).toBe(1)
  })

  it('keeps another technician out of a run (404 to read and to record), and lets the blender in', async () => {
    const { runId } = await bookRun()
    const run = await detail(technician, runId)
    await otherTech.agent.get(`/api/runs/${runId}`).expect(404)
    await otherTech.agent
      .post(`/api/runs/${runId}/readings`)
      .set('x-csrf-token', otherTech.csrf)
      .send(reading(run, run.steps[0].cumulativeGaugePressure.value, 15))
      .expect(404)
    expect(await t.orm.em.fork().count(FillReadingSchema, { run: runId })).toBe(0)
    const qa = await t.signIn('qa')
    await qa.agent.get(`/api/runs/${runId}`).expect(200)
    await qa.agent
      .post(`/api/runs/${runId}/readings`)
      .set('x-csrf-token', qa.csrf)
      .send(reading(run, 1, 15))
      .expect(403)
    const asBlender = await detail(blender, runId)
    expect(asBlender.canRecord).toBe(true)
  })

  it('validates readings: 400 for malformed input, 422 for implausible values, nothing written', async () => {
    const { runId } = await bookRun()
    const run = await detail(technician, runId)
    const post = (body: unknown) =>
      technician.agent
        .post(`/api/runs/${runId}/readings`)
        .set('x-csrf-token', technician.csrf)
        .send(body as object)
    const good = reading(run, 10, 15)
    const { clientRequestId: _omit, ...noId } = good
    expect((await post(noId)).status).toBe(400)
    expect((await post({ ...good, pressure: { value: 10, unit: 'furlongs', reference: 'gauge' } })).status).toBe(400)
    expect((await post({ ...good, extra: true })).status).toBe(400)
    const hot = await post({ ...reading(run, 10, 500) })
    expect(hot.status).toBe(422)
    expect(hot.body.errors[0].field).toBe('temperature.value')
    const huge = await post({ ...reading(run, 900, 15) })
    expect(huge.status).toBe(422)
    expect(huge.body.detail).toMatch(/test pressure/)
    expect((await post({ ...reading(run, 10, 15), stepIndex: 1 })).status).toBe(409)
    expect(await t.orm.em.fork().count(FillReadingSchema, { run: runId })).toBe(0)
  })

  it('keeps readings after a restart: a new app instance on the same database file shows them', async () => {
    const { runId } = await bookRun()
    const run = await detail(technician, runId)
    const recorded = await technician.agent
      .post(`/api/runs/${runId}/readings`)
      .set('x-csrf-token', technician.csrf)
      .send(reading(run, run.steps[0].cumulativeGaugePressure.value, 15))
      .expect(201)
    const orm2 = await initOrm({ databasePath: t.dbPath, databaseUrl: t.databaseUrl })
    try {
      const app2 = createApp(
        { ...t.deps, orm: orm2 },
        { sessionSecret: 'second-instance-secret-0123456789', cookieSecure: 'false', trustProxy: 'loopback', logger: pino({ level: 'silent' }) },
      )
      const tech2 = await signInAs(app2, 'technician@demo.test')
      const again = (await tech2.agent.get(`/api/runs/${runId}`).expect(200)).body as RunDetail
      expect(again.currentStep).toBe(1)
      expect(again.version).toBe(recorded.body.run.version)
      expect(again.readings.map((r) => r.id)).toEqual([recorded.body.reading.id])
      expect(again.readings[0].pressureBarGauge).toBeCloseTo(run.steps[0].cumulativeGaugePressure.value, 9)
    } finally {
      await orm2.close()
    }
  })

  it('refuses UPDATE and DELETE of a recorded reading in the database itself', async () => {
    const { runId } = await bookRun()
    const run = await detail(technician, runId)
    const res = await technician.agent
      .post(`/api/runs/${runId}/readings`)
      .set('x-csrf-token', technician.csrf)
      .send(reading(run, run.steps[0].cumulativeGaugePressure.value, 15))
      .expect(201)
    const conn = t.orm.em.fork().getConnection()
    await expect(conn.execute('update fill_readings set pressure_bar_gauge = 0 where id = ?', [res.body.reading.id])).rejects.toThrow(/immutable/)
    await expect(conn.execute('delete from fill_readings where id = ?', [res.body.reading.id])).rejects.toThrow(/immutable/)
    const rows = await conn.execute('select pressure_bar_gauge from fill_readings where id = ?', [res.body.reading.id])
    expect(rows[0].pressure_bar_gauge).toBeCloseTo(run.steps[0].cumulativeGaugePressure.value, 9)
  })
})

describe('pause, overshoot and finish', () => {
  it('pauses (no recording while paused) and resumes', async () => {
    const { runId } = await bookRun()
    let run = await detail(technician, runId)
    run = (
      await technician.agent
        .post(`/api/runs/${runId}/pause`)
        .set('x-csrf-token', technician.csrf)
        .send({ expectedVersion: run.version, note: 'cylinder trolley needed' })
        .expect(200)
    ).body
    expect(run.status).toBe('paused')
    await technician.agent
      .post(`/api/runs/${runId}/readings`)
      .set('x-csrf-token', technician.csrf)
      .send(reading(run, 10, 15))
      .expect(409)
    run = (await technician.agent.post(`/api/runs/${runId}/resume`).set('x-csrf-token', technician.csrf).send({ expectedVersion: run.version }).expect(200))
      .body
    expect(run.status).toBe('ready')
    await technician.agent.post(`/api/runs/${runId}/complete`).set('x-csrf-token', technician.csrf).send({ expectedVersion: run.version }).expect(409)
  })

  it('re-plans after an overshoot, waits for confirmation, and fills to the new targets', async () => {
    const { runId, orderId, cylinderId } = await bookRun()
    let run = await detail(technician, runId)
    const high = run.steps[0].toleranceWindow.gaugePressureHigh.value
    // 30 % more CO2 than planned: beyond the window, and more than later additions can correct at 150 bar
    const over = await technician.agent
      .post(`/api/runs/${runId}/readings`)
      .set('x-csrf-token', technician.csrf)
      .send(reading(run, run.steps[0].cumulativeGaugePressure.value * 1.3, 15))
      .expect(201)
    expect(over.body.reading.outcome).toBe('over')
    run = over.body.run
    expect(run.currentStep).toBe(0)
    expect(run.pendingReplan).not.toBeNull()
    expect(run.pendingReplan?.status).toBe('cannot-meet')
    const kinds = run.pendingReplan?.options.map((o) => o.kind) ?? []
    expect(kinds).toContain('top-up')
    expect(kinds).toContain('remake')
    const inferredCo2 = run.pendingReplan?.composition.find((c) => c.gas === 'carbon-dioxide')
    expect(inferredCo2?.fraction).toBe(1)
    expect(high).toBeLessThan(run.steps[0].cumulativeGaugePressure.value * 1.3)

    // nothing else is recorded before the technician confirms
    await technician.agent
      .post(`/api/runs/${runId}/readings`)
      .set('x-csrf-token', technician.csrf)
      .send(reading(run, 20, 15))
      .expect(409)
    await technician.agent
      .post(`/api/runs/${runId}/replan/confirm`)
      .set('x-csrf-token', technician.csrf)
      .send({ expectedVersion: run.version, option: 'continue' })
      .expect(422)
    const topUp = run.pendingReplan?.options.find((o) => o.kind === 'top-up')
    run = (
      await technician.agent
        .post(`/api/runs/${runId}/replan/confirm`)
        .set('x-csrf-token', technician.csrf)
        .send({ expectedVersion: run.version, option: 'top-up' })
        .expect(200)
    ).body
    expect(run.pendingReplan).toBeNull()
    expect(run.replanCount).toBe(1)
    expect(run.currentStep).toBe(1)
    const argonStep = run.steps[1]
    expect(argonStep.gas).toBe('argon')
    expect(argonStep.segment).toBe(1)
    expect(argonStep.cumulativeGaugePressure.value).toBeCloseTo(topUp?.steps.at(-1)?.cumulativeGaugePressure.value ?? Number.NaN, 6)
    // the top-up raises the final pressure above the ordered 150 bar, within the 200 bar service pressure
    expect(argonStep.cumulativeGaugePressure.value).toBeGreaterThan(150)
    expect(argonStep.cumulativeGaugePressure.value).toBeLessThanOrEqual(200)

    const last = await technician.agent
      .post(`/api/runs/${runId}/readings`)
      .set('x-csrf-token', technician.csrf)
      .send(reading(run, argonStep.cumulativeGaugePressure.value, 15))
      .expect(201)
    expect(last.body.reading.outcome).toBe('on-target')
    run = last.body.run
    expect(run.allStepsDone).toBe(true)
    run = (await technician.agent.post(`/api/runs/${runId}/complete`).set('x-csrf-token', technician.csrf).send({ expectedVersion: run.version }).expect(200))
      .body
    expect(run.status).toBe('completed')
    const em = t.orm.em.fork()
    expect((await em.findOneOrFail(CylinderSchema, { id: cylinderId })).status).toBe('awaiting-analysis')
    expect((await em.findOneOrFail(OrderSchema, { id: orderId })).status).toBe('analysis')
    const history = await technician.agent.get(`/api/cylinders/${cylinderId}/history`).expect(200)
    expect(history.body.runs[0].runId).toBe(runId)
    expect(history.body.runs[0].readings.map((r: { outcome: string }) => r.outcome)).toEqual(['over', 'on-target'])
  })

  it('keeps an order at the manifold until every ordered cylinder is filled', async () => {
    const { planId, orderId } = await approvedPlan(2)
    const cyl = await freeCylinder()
    const booked = await blender.agent
      .post('/api/runs')
      .set('x-csrf-token', blender.csrf)
      .send({ planId, cylinderIds: [cyl], technicianId, scheduledFor: today })
      .expect(201)
    const runId = booked.body[0].id as number
    let run = await detail(technician, runId)
    for (const step of run.steps) {
      run = (
        await technician.agent
          .post(`/api/runs/${runId}/readings`)
          .set('x-csrf-token', technician.csrf)
          .send(reading(run, step.cumulativeGaugePressure.value, 15))
          .expect(201)
      ).body.run
    }
    run = (await technician.agent.post(`/api/runs/${runId}/complete`).set('x-csrf-token', technician.csrf).send({ expectedVersion: run.version }).expect(200))
      .body
    expect(run.status).toBe('completed')
    expect((await t.orm.em.fork().findOneOrFail(OrderSchema, { id: orderId })).status).toBe('filling')
  })

  it('vents after an overshoot and recomputes the targets from the pressure left', async () => {
    const { runId } = await bookRun()
    let run = await detail(technician, runId)
    run = (
      await technician.agent
        .post(`/api/runs/${runId}/readings`)
        .set('x-csrf-token', technician.csrf)
        .send(reading(run, run.steps[0].cumulativeGaugePressure.value * 1.3, 15))
        .expect(201)
    ).body.run
    const vent = run.pendingReplan?.options.find((o) => o.kind === 'vent')
    expect(vent?.ventToGaugePressure).not.toBeNull()
    run = (
      await technician.agent
        .post(`/api/runs/${runId}/replan/confirm`)
        .set('x-csrf-token', technician.csrf)
        .send({ expectedVersion: run.version, option: 'vent' })
        .expect(200)
    ).body
    expect(run.steps[1].kind).toBe('vent')
    expect(run.steps[1].cautions.map((c) => c.kind)).toContain('vent')
    const limit = vent?.ventToGaugePressure?.value ?? 0
    // not vented far enough: asked to vent further
    const notEnough = await technician.agent
      .post(`/api/runs/${runId}/readings`)
      .set('x-csrf-token', technician.csrf)
      .send(reading(run, limit + 1, 15))
      .expect(201)
    expect(notEnough.body.reading.outcome).toBe('over')
    run = notEnough.body.run
    expect(run.currentStep).toBe(1)
    // vented to a little below the limit: the argon target is recomputed from that pressure
    const vented = await technician.agent
      .post(`/api/runs/${runId}/readings`)
      .set('x-csrf-token', technician.csrf)
      .send(reading(run, limit - 0.5, 15))
      .expect(201)
    expect(vented.body.reading.outcome).toBe('on-target')
    run = vented.body.run
    expect(run.currentStep).toBe(2)
    expect(run.steps[2].note).toMatch(/recomputed/)
    // vented below the limit: a little CO2 may be needed again; the fill still ends with argon at the ordered
    // 150 bar (gauge) — fill and reference temperature are both 15 °C in this plan
    const final = run.steps[run.steps.length - 1]
    expect(final.gas).toBe('argon')
    expect(final.cumulativeGaugePressure.value).toBeCloseTo(150, 6)
    expect(run.steps.slice(2).every((s) => s.segment === 1)).toBe(true)
  })

  it('reassigns a run not started to another technician (blender only)', async () => {
    const { runId } = await bookRun()
    const run = await detail(blender, runId)
    await technician.agent
      .put(`/api/runs/${runId}/assignment`)
      .set('x-csrf-token', technician.csrf)
      .send({ technicianId: otherTechId, scheduledFor: today, expectedVersion: run.version })
      .expect(403)
    const moved = await blender.agent
      .put(`/api/runs/${runId}/assignment`)
      .set('x-csrf-token', blender.csrf)
      .send({ technicianId: otherTechId, scheduledFor: today, expectedVersion: run.version })
      .expect(200)
    expect(moved.body.technician.id).toBe(otherTechId)
    await otherTech.agent.get(`/api/runs/${runId}`).expect(200)
    await technician.agent.get(`/api/runs/${runId}`).expect(404)
  })
})

describe('demo seed step', () => {
  it('books runs for an approved plan with none, starts one and finishes another on an order already filling, and never books twice', async () => {
    const { planId, orderId } = await approvedPlan(2)
    const em = t.orm.em.fork()
    const order = await em.findOneOrFail(OrderSchema, { id: orderId })
    order.status = 'filling'
    await em.flush()
    await freeCylinder()
    await freeCylinder()
    await t.orm.em.fork().transactional((tx) => seedRuns(tx))
    const runs = await t.orm.em.fork().find(FillRunSchema, { plan: planId }, { orderBy: { id: 'asc' } })
    expect(runs).toHaveLength(2)
    expect(runs[0].status).toBe('in-progress')
    expect(runs[0].currentStep).toBe(1)
    // the second is finished (every step on target) and waits for QA
    expect(runs[1].status).toBe('completed')
    expect(await t.orm.em.fork().count(FillReadingSchema, { run: runs[0].id })).toBe(1)
    const finished = await detail(technician, runs[1].id)
    expect(finished.readings.length).toBe(finished.steps.length)
    expect(finished.readings.every((r: { outcome: string }) => r.outcome === 'on-target')).toBe(true)
    const seeded = await detail(technician, runs[0].id)
    expect(seeded.readings[0].outcome).toBe('on-target')
    await t.orm.em.fork().transactional((tx) => seedRuns(tx))
    expect(await t.orm.em.fork().count(FillRunSchema, { plan: planId })).toBe(2)
  })
})

describe('target at the measured temperature (pure helper shared by server and tablet)', () => {
  // Linear interpolation between rows of the plan's constant-density table: common practice, no source.
  // The rows below are invented round numbers, so the expected values are plain arithmetic.
  const row = (c: number, barAbs: number) => ({
    temperature: { value: c, unit: 'C' as const },
    pressure: { value: barAbs, unit: 'bar' as const, reference: 'absolute' as const },
    gaugePressure: { value: barAbs - 1, unit: 'bar' as const, reference: 'gauge' as const },
  })
  const table = [row(20, 104), row(10, 100), row(30, 108)]

  it('interpolates between rows (in any order) and is exact on a row', () => {
    expect(pressureAtTemperature(table, 15)).toEqual({ pressureBarAbs: 102, extrapolated: false })
    expect(pressureAtTemperature(table, 20)?.pressureBarAbs).toBe(104)
    expect(pressureAtTemperature(table, 27.5)?.pressureBarAbs).toBeCloseTo(107, 12)
  })

  it('extrapolates from the nearest two rows outside the table and says so', () => {
    expect(pressureAtTemperature(table, 35)).toEqual({ pressureBarAbs: 110, extrapolated: true })
    expect(pressureAtTemperature(table, 0)).toEqual({ pressureBarAbs: 96, extrapolated: true })
    expect(pressureAtTemperature([], 15)).toBeNull()
  })
})
