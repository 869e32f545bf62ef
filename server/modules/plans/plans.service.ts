import type { EntityManager } from '@mikro-orm/core'
import { fillPlanFromRequest } from '#shared/planning/index.ts'
import type { Role, SessionUser } from '#shared/schemas/auth.ts'
import type { FillPlanRequest, FillPlanResponse } from '#shared/schemas/fill-plan.ts'
import { ORDER_STATUS_LABEL, type OrderStatus } from '#shared/schemas/order-lifecycle.ts'
import {
  type PlanAssignInput,
  type PlanCreateInput,
  PlanCreateInputSchema,
  type PlanCylinderRef,
  type PlanDetail,
  type PlanLineSpec,
  type PlanListQuery,
  PlanListQuerySchema,
  type PlanOptionsParsed,
  PlanOptionsSchema,
  type PlanQueue,
  PlanSetupError,
  type PlanSummary,
  planRequestFromLine,
  type TechnicianOption,
} from '#shared/schemas/plan.ts'
import { audit } from '../../lib/audit.ts'
import type { AppDeps } from '../../lib/deps.ts'
import { ConflictError, NotFoundError, UnprocessableError } from '../../lib/http-errors.ts'
import { rethrowWithWireField } from '../calc/calc.service.ts'
import { type Cylinder, CylinderSchema } from '../cylinders/cylinder.entity.ts'
import { type Order, type OrderLine, OrderLineSchema, OrderSchema } from '../orders/order.entity.ts'
import { transitionOrder } from '../orders/orders.service.ts'
import { FillRunSchema } from '../runs/fill-run.entity.ts'
import { createRunsForPlan } from '../runs/runs.service.ts'
import { UserSchema } from '../users/user.entity.ts'
import { type FillPlan, FillPlanSchema } from './fill-plan.entity.ts'
import { buildFillSheetPdf } from './fill-sheet.ts'

/** Staff who may read plans (customers never see the shop's fill plans). */
export const PLAN_READERS: readonly Role[] = ['admin', 'blender', 'sales', 'technician', 'qa']
/** Who computes, approves and assigns plans. */
export const PLANNERS: readonly Role[] = ['admin', 'blender']

/** Order states in which a line may be (re-)planned. */
const PLANNABLE: readonly OrderStatus[] = ['accepted', 'planned', 'filling']

function todayIso(): string {
  return new Date().toISOString().slice(0, 10)
}

// ---- mapping ------------------------------------------------------------------------------------------------

type LineWithOrder = OrderLine & { order: Order & { customer: { company: string } } }

function toLineSpec(line: LineWithOrder): PlanLineSpec {
  return {
    id: line.id,
    lineNo: line.lineNo,
    description: line.description,
    components: (line.components as PlanLineSpec['components']).map((c) => ({
      gas: c.gas,
      fraction: c.fraction,
      ...(c.amount !== undefined ? { amount: c.amount } : {}),
      ...(c.unit !== undefined ? { unit: c.unit } : {}),
    })),
    balanceGas: line.balanceGas,
    blendTolerancePct: line.blendTolerancePct,
    certificationUncertaintyPct: line.certificationUncertaintyPct,
    waterVolumeL: line.waterVolumeL,
    valveOutlet: line.valveOutlet,
    quantity: line.quantity,
    finalPressureBarGauge: line.finalPressureBarGauge,
    method: line.method,
    order: {
      id: line.order.id,
      number: line.order.number,
      status: line.order.status,
      customer: line.order.customer.company,
      neededBy: line.order.neededBy ?? null,
    },
  }
}

export function toCylinderRef(c: Cylinder): PlanCylinderRef {
  const r = c.residual
  return {
    id: c.id,
    serial: c.serial,
    waterVolumeL: c.waterVolumeL,
    servicePressureBar: c.servicePressureBar,
    testPressureBar: c.testPressureBar,
    material: c.material,
    valveOutlet: c.valveOutlet,
    oxygenClean: c.oxygenClean,
    nextTestDate: c.nextTestDate,
    residual:
      r.kind === 'residual'
        ? { kind: 'residual', pressureBarGauge: r.pressureBarGauge ?? 0, composition: (r.composition ?? []).map((x) => ({ gas: x.gas, fraction: x.fraction })) }
        : { kind: 'evacuated' },
  }
}

async function userNames(em: EntityManager, ids: (number | null | undefined)[]): Promise<Map<number, string>> {
  const wanted = [...new Set(ids.filter((x): x is number => typeof x === 'number'))]
  if (!wanted.length) return new Map()
  const users = await em.find(UserSchema, { id: { $in: wanted } })
  return new Map(users.map((u) => [u.id, u.name]))
}

function blockingReason(result: Record<string, unknown>): string | null {
  const warnings = (result as Partial<FillPlanResponse>).warnings ?? []
  const block = warnings.find((w) => w.severity === 'block')
  return block ? block.message : null
}

type PlanWithLine = FillPlan & { orderLine: LineWithOrder; cylinder: Cylinder | null }

function toSummary(plan: PlanWithLine, names: Map<number, string>): PlanSummary {
  return {
    id: plan.id,
    planVersion: plan.planVersion,
    status: plan.status,
    model: plan.model as PlanSummary['model'],
    method: plan.method as PlanSummary['method'],
    blocking: plan.blocking,
    blockingReason: plan.blocking ? blockingReason(plan.result) : null,
    version: plan.version,
    createdAt: plan.createdAt.toISOString(),
    createdBy: plan.createdById ? (names.get(plan.createdById) ?? null) : null,
    approvedAt: plan.approvedAt ? plan.approvedAt.toISOString() : null,
    approvedBy: plan.approvedById ? (names.get(plan.approvedById) ?? null) : null,
    orderLineId: plan.orderLine.id,
    orderId: plan.orderLine.order.id,
    orderNumber: plan.orderLine.order.number,
    lineNo: plan.orderLine.lineNo,
    lineDescription: plan.orderLine.description,
    customer: plan.orderLine.order.customer.company,
    cylinderSerial: plan.cylinder?.serial ?? null,
  }
}

const PLAN_POPULATE = ['orderLine', 'orderLine.order', 'orderLine.order.customer', 'cylinder'] as const

async function loadPlan(em: EntityManager, id: number): Promise<PlanWithLine> {
  const plan = await em.findOne(FillPlanSchema, { id }, { populate: PLAN_POPULATE as never })
  if (!plan) throw new NotFoundError(`No fill plan ${id}.`)
  return plan as unknown as PlanWithLine
}

async function loadLine(em: EntityManager, orderLineId: number): Promise<LineWithOrder> {
  const line = await em.findOne(OrderLineSchema, { id: orderLineId }, { populate: ['order', 'order.customer'] as never })
  if (!line) throw new NotFoundError(`No order line ${orderLineId}.`)
  return line as unknown as LineWithOrder
}

async function runsOf(em: EntityManager, planId: number): Promise<PlanDetail['runs']> {
  const runs = await em.find(FillRunSchema, { plan: planId }, { populate: ['cylinder'] as never, orderBy: { id: 'asc' } })
  return runs.map((r) => ({
    id: r.id,
    cylinderId: r.cylinder.id,
    cylinderSerial: (r.cylinder as Cylinder).serial,
    technicianId: r.technicianId ?? null,
    scheduledFor: r.scheduledFor,
    status: r.status,
  }))
}

/**
 * The blender's options, read back from the stored request (planRequestFromLine copies every option into it), so
 * the workspace can reopen a plan as it was set up.
 */
export function optionsFromRequest(request: FillPlanRequest, inventoryCylinder: boolean): PlanOptionsParsed {
  return PlanOptionsSchema.parse({
    model: request.model,
    method: request.method,
    order: request.order,
    fillTemperature: request.fillTemperature,
    atmosphericPressure: request.atmosphericPressure,
    minimumTemperature: request.minimumTemperature,
    maximumTemperature: request.maximumTemperature,
    sources: request.sources,
    gauge: request.gauge,
    scale: request.scale,
    uncertaintyBudgetPercent: request.uncertaintyBudgetPercent,
    cylinderRules: request.cylinderRules,
    temperatureUncertaintyK: request.temperatureUncertaintyK,
    proposePremix: request.proposePremix,
    cylinder: inventoryCylinder ? undefined : request.cylinder,
    displayUnits: request.displayUnits,
  })
}

async function toDetail(em: EntityManager, plan: PlanWithLine): Promise<PlanDetail> {
  const names = await userNames(em, [plan.createdById, plan.approvedById])
  const request = plan.request as unknown as FillPlanRequest
  return {
    ...toSummary(plan, names),
    line: toLineSpec(plan.orderLine),
    cylinder: plan.cylinder ? toCylinderRef(plan.cylinder) : null,
    options: optionsFromRequest(request, plan.cylinder !== null),
    request,
    result: plan.result as unknown as FillPlanResponse,
    assignedTechnicianId: plan.assignedTechnicianId ?? null,
    runs: await runsOf(em, plan.id),
  }
}

// ---- computing ----------------------------------------------------------------------------------------------

/** The server's own computation of a plan (never the client's numbers). */
export function computeStoredPlan(line: PlanLineSpec, cylinder: PlanCylinderRef | null, options: PlanOptionsParsed, asOfDate = todayIso()) {
  let request: FillPlanRequest
  try {
    request = planRequestFromLine(line, cylinder, options, asOfDate)
  } catch (err) {
    if (err instanceof PlanSetupError) throw new UnprocessableError(err.message, [{ field: err.field, message: err.message }])
    throw err
  }
  try {
    return { request, result: fillPlanFromRequest(request) }
  } catch (err) {
    rethrowWithWireField(err)
  }
}

// ---- reads --------------------------------------------------------------------------------------------------

export async function getLineSpec(em: EntityManager, orderLineId: number): Promise<PlanLineSpec> {
  return toLineSpec(await loadLine(em, orderLineId))
}

export async function getPlanDetail(em: EntityManager, id: number): Promise<PlanDetail> {
  return toDetail(em, await loadPlan(em, id))
}

export async function listPlans(em: EntityManager, rawQuery: PlanListQuery): Promise<{ items: PlanSummary[] }> {
  const q = PlanListQuerySchema.parse(rawQuery)
  const where: Record<string, unknown> = {}
  if (q.orderLineId) where.orderLine = q.orderLineId
  if (q.status) where.status = q.status
  const plans = (await em.find(FillPlanSchema, where, {
    populate: PLAN_POPULATE as never,
    orderBy: { createdAt: 'desc', id: 'desc' },
    limit: q.limit,
  })) as unknown as PlanWithLine[]
  const names = await userNames(
    em,
    plans.flatMap((p) => [p.createdById, p.approvedById]),
  )
  return { items: plans.map((p) => toSummary(p, names)) }
}

/** The blender's home queues: accepted orders with lines lacking an approved plan, and plans awaiting approval. */
export async function planQueue(em: EntityManager): Promise<PlanQueue> {
  const orders = await em.find(OrderSchema, { status: 'accepted' }, { populate: ['customer'] as never, orderBy: { createdAt: 'asc', id: 'asc' }, limit: 100 })
  const orderIds = orders.map((o) => o.id)
  const lines = orderIds.length ? await em.find(OrderLineSchema, { order: { $in: orderIds } }, { orderBy: { lineNo: 'asc' } }) : []
  const lineIds = lines.map((l) => l.id)
  const plans = lineIds.length ? await em.find(FillPlanSchema, { orderLine: { $in: lineIds }, status: { $ne: 'superseded' } }) : []
  const stateOf = new Map<number, 'none' | 'draft' | 'approved'>()
  for (const p of plans) {
    const current = stateOf.get(p.orderLine.id)
    if (p.status === 'approved') stateOf.set(p.orderLine.id, 'approved')
    else if (current !== 'approved') stateOf.set(p.orderLine.id, 'draft')
  }
  const ordersNeedingPlan = orders
    .map((o) => ({
      orderId: o.id,
      number: o.number,
      customer: (o.customer as unknown as { company: string }).company,
      neededBy: o.neededBy ?? null,
      lines: lines
        .filter((l) => l.order.id === o.id)
        .map((l) => ({ id: l.id, lineNo: l.lineNo, description: l.description, planState: stateOf.get(l.id) ?? ('none' as const) })),
    }))
    .filter((o) => o.lines.some((l) => l.planState !== 'approved'))
    .sort((a, b) => (a.neededBy ?? '9999').localeCompare(b.neededBy ?? '9999'))
  const drafts = (await em.find(
    FillPlanSchema,
    { status: 'draft' },
    { populate: PLAN_POPULATE as never, orderBy: { createdAt: 'asc' }, limit: 50 },
  )) as unknown as PlanWithLine[]
  const names = await userNames(
    em,
    drafts.map((p) => p.createdById),
  )
  return { ordersNeedingPlan, awaitingApproval: drafts.map((p) => toSummary(p, names)) }
}

export async function technicianOptions(em: EntityManager): Promise<TechnicianOption[]> {
  const users = await em.find(UserSchema, { active: true }, { orderBy: { name: 'asc' } })
  return users.filter((u) => u.roles.includes('technician')).map((u) => ({ id: u.id, name: u.name, email: u.email }))
}

// ---- writes -------------------------------------------------------------------------------------------------

/**
 * Computes a plan for an order line on the server and stores it as the line's next version; the versions before
 * it become 'superseded'. A plan with blocking findings is stored too (as a draft that cannot be approved).
 */
export async function createPlan(em: EntityManager, user: SessionUser, rawInput: PlanCreateInput): Promise<PlanDetail> {
  const input = PlanCreateInputSchema.parse(rawInput)
  const line = await loadLine(em, input.orderLineId)
  if (!PLANNABLE.includes(line.order.status)) {
    throw new UnprocessableError(
      `Order ${line.order.number} is "${ORDER_STATUS_LABEL[line.order.status as OrderStatus]}": fill plans are made once the customer has accepted the quote.`,
      [{ field: 'orderLineId', message: 'The order is not accepted yet (or is closed).' }],
    )
  }
  let cylinder: Cylinder | null = null
  if (input.cylinderId !== null) {
    cylinder = await em.findOne(CylinderSchema, { id: input.cylinderId })
    if (!cylinder) throw new UnprocessableError(`No cylinder ${input.cylinderId}.`, [{ field: 'cylinderId', message: 'No such cylinder.' }])
    if (cylinder.status === 'quarantine' || cylinder.status === 'retired') {
      throw new UnprocessableError(
        `Cylinder ${cylinder.serial} is ${cylinder.status === 'quarantine' ? 'held back' : 'out of service'} and cannot be planned.`,
        [{ field: 'cylinderId', message: 'Choose a cylinder that is in service.' }],
      )
    }
  }
  const spec = toLineSpec(line)
  const { request, result } = computeStoredPlan(spec, cylinder ? toCylinderRef(cylinder) : null, input.options)

  const planId = await em.transactional(async (tx) => {
    const running = await tx.count(FillRunSchema, { plan: { orderLine: line.id, status: { $ne: 'superseded' } }, status: { $in: ['in-progress', 'paused'] } })
    if (running > 0) {
      throw new ConflictError('A fill from the current plan of this line is running at the manifold; finish or abort it before making a new version.')
    }
    const previous = await tx.find(FillPlanSchema, { orderLine: line.id })
    const planVersion = previous.reduce((m, p) => Math.max(m, p.planVersion), 0) + 1
    for (const p of previous) if (p.status !== 'superseded') p.status = 'superseded'
    const plan = tx.create(FillPlanSchema, {
      orderLine: line.id as never,
      cylinder: (cylinder ? cylinder.id : null) as never,
      planVersion,
      status: 'draft',
      model: request.model,
      method: request.method,
      request: request as unknown as Record<string, unknown>,
      result: result as unknown as Record<string, unknown>,
      blocking: !result.approvable,
      createdById: user.id,
    })
    await tx.flush()
    audit(tx, user, 'plan.create', 'FillPlan', plan.id, {
      orderLineId: line.id,
      planVersion,
      model: request.model,
      method: request.method,
      blocking: !result.approvable,
    })
    await tx.flush()
    return plan.id
  })
  em.clear()
  return getPlanDetail(em, planId)
}

/**
 * Approves a plan the blender has reviewed. Refused: 409 when the version is stale or a newer plan exists,
 * 422 while a blocking finding stands. When every line of the order then has an approved plan, the order moves
 * to 'planned'.
 */
export async function approvePlan(em: EntityManager, user: SessionUser, id: number, expectedVersion: number): Promise<PlanDetail> {
  await em.transactional(async (tx) => {
    const plan = await loadPlan(tx, id)
    if (plan.version !== expectedVersion) {
      throw new ConflictError(`Plan ${id} changed since you opened it (version ${plan.version}, you saw ${expectedVersion}). Reload it and check again.`, {
        currentVersion: plan.version,
      })
    }
    if (plan.status === 'superseded')
      throw new ConflictError(`Version ${plan.planVersion} of this plan has been replaced by a newer version; approve the current one.`)
    if (plan.status === 'approved') return
    if (plan.blocking) {
      const warnings = ((plan.result as Partial<FillPlanResponse>).warnings ?? []).filter((w) => w.severity === 'block')
      throw new UnprocessableError(
        `This plan cannot be approved while a blocking finding stands: ${warnings[0]?.message ?? 'see the findings'}`,
        warnings.map((w) => ({ field: w.step !== undefined ? `steps.${w.step}` : 'plan', message: w.message, code: w.code })),
      )
    }
    plan.status = 'approved'
    plan.approvedById = user.id
    plan.approvedAt = new Date()
    audit(tx, user, 'plan.approve', 'FillPlan', plan.id, { planVersion: plan.planVersion, orderLineId: plan.orderLine.id })
    await tx.flush()

    const order = plan.orderLine.order
    if (order.status === 'accepted') {
      const lines = await tx.find(OrderLineSchema, { order: order.id })
      const approved = await tx.find(FillPlanSchema, { orderLine: { $in: lines.map((l) => l.id) }, status: 'approved' })
      const covered = new Set(approved.map((p) => p.orderLine.id))
      if (lines.every((l) => covered.has(l.id))) await transitionOrder(tx, user, order.id, 'planned')
    }
  })
  em.clear()
  return getPlanDetail(em, id)
}

/** Books cylinders and a technician for an approved plan (one fill run per cylinder). */
export async function assignPlan(em: EntityManager, user: SessionUser, id: number, input: PlanAssignInput): Promise<{ runs: PlanDetail['runs'] }> {
  await em.transactional(async (tx) => {
    const plan = await loadPlan(tx, id)
    if (plan.status !== 'approved') {
      throw new UnprocessableError('Only an approved plan can be assigned to cylinders and a technician.', [
        { field: 'id', message: 'Approve the plan first.' },
      ])
    }
    const tech = await tx.findOne(UserSchema, { id: input.technicianId })
    if (!tech?.active || !tech.roles.includes('technician')) {
      throw new UnprocessableError(`User ${input.technicianId} is not an active technician.`, [{ field: 'technicianId', message: 'Choose a technician.' }])
    }
    await createRunsForPlan(tx, user, plan.id, input.cylinderIds, input.technicianId, input.scheduledFor)
    const fresh = await tx.findOneOrFail(FillPlanSchema, { id: plan.id })
    fresh.assignedTechnicianId = input.technicianId
    audit(tx, user, 'plan.assign', 'FillPlan', plan.id, { cylinderIds: input.cylinderIds, technicianId: input.technicianId, scheduledFor: input.scheduledFor })
    await tx.flush()
  })
  em.clear()
  return { runs: await runsOf(em, id) }
}

function sheetFileName(detail: PlanDetail): string {
  return `fill-sheet-${detail.orderNumber}-L${detail.lineNo}-v${detail.planVersion}.pdf`.replace(/[^A-Za-z0-9._-]/g, '_')
}

export async function fillSheet(em: EntityManager, id: number, size: 'A4' | 'LETTER'): Promise<{ pdf: Buffer; filename: string }> {
  const detail = await getPlanDetail(em, id)
  const names = await userNames(em, [detail.assignedTechnicianId])
  const pdf = await buildFillSheetPdf(detail, { size, technicianName: detail.assignedTechnicianId ? (names.get(detail.assignedTechnicianId) ?? null) : null })
  return { pdf, filename: sheetFileName(detail) }
}

/** E-mails the fill sheet PDF to a technician. */
export async function emailFillSheet(
  em: EntityManager,
  deps: AppDeps,
  user: SessionUser,
  id: number,
  technicianId: number,
): Promise<{ sentTo: string; messageId: string }> {
  const tech = await em.findOne(UserSchema, { id: technicianId })
  if (!tech?.active || !tech.roles.includes('technician')) {
    throw new UnprocessableError(`User ${technicianId} is not an active technician.`, [{ field: 'technicianId', message: 'Choose a technician.' }])
  }
  const detail = await getPlanDetail(em, id)
  const pdf = await buildFillSheetPdf(detail, { size: 'A4', technicianName: tech.name })
  const statusLine =
    detail.status === 'approved' ? 'The plan is approved for filling.' : 'The plan is NOT approved yet: do not fill from this sheet until it is.'
  const text = [
    `Hello ${tech.name},`,
    '',
    `Attached is the fill sheet for order ${detail.orderNumber}, line ${detail.lineNo} (${detail.lineDescription}), plan version ${detail.planVersion}.`,
    statusLine,
    '',
    'High-pressure gas: check the cylinder markings, test date and valve before connecting; follow the cautions on the sheet, local codes and licensed practice.',
    '',
    `Sent by ${user.name} from Fillwright.`,
  ].join('\n')
  const sent = await deps.mailer.send({
    to: tech.email,
    subject: `Fill sheet ${detail.orderNumber} line ${detail.lineNo} (plan v${detail.planVersion})`,
    text,
    attachments: [{ filename: sheetFileName(detail), content: pdf, contentType: 'application/pdf' }],
  })
  audit(em, user, 'plan.email-sheet', 'FillPlan', id, { to: tech.email, messageId: sent.messageId })
  await em.flush()
  return { sentTo: tech.email, messageId: sent.messageId }
}
