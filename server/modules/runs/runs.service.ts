import { type EntityManager, OptimisticLockError, UniqueConstraintViolationException } from '@mikro-orm/core'
import { fillPlanFromRequest, PlanningInputError, replanFromRequest } from '#shared/planning/index.ts'
import type { SessionUser } from '#shared/schemas/auth.ts'
import { localIsoDate } from '#shared/schemas/cylinder.ts'
import {
  type FillPlanCoreResponse,
  type FillPlanRequest,
  FillPlanRequestSchema,
  FillPlanResponseSchema,
  type ReplanRequest,
  type ReplanResponse,
} from '#shared/schemas/fill-plan.ts'
import type { OrderStatus } from '#shared/schemas/order-lifecycle.ts'
import {
  type ConfirmReplanInput,
  KG_PER_MASS_UNIT,
  type PendingReplan,
  type ReassignRunInput,
  type RecordReadingInput,
  type RecordReadingResult,
  type RunDetail,
  type RunListQuerySchema,
  type RunReading,
  type RunSummary,
  type RunVersionInput,
  toBar,
  toCelsius,
} from '#shared/schemas/run.ts'
import type { z } from 'zod'
import { audit } from '../../lib/audit.ts'
import { ConflictError, NotFoundError, UnprocessableError } from '../../lib/http-errors.ts'
import { readRows, type SqlParam } from '../../lib/prepared-reads.ts'
import { type Cylinder, CylinderSchema } from '../cylinders/cylinder.entity.ts'
import { assertCylinderUsable } from '../cylinders/cylinders.service.ts'
import { type Order, type OrderLine, OrderLineSchema } from '../orders/order.entity.ts'
import { transitionOrder } from '../orders/orders.service.ts'
import { type FillPlan, FillPlanSchema } from '../plans/fill-plan.entity.ts'
import { UserSchema } from '../users/user.entity.ts'
import { type FillReading, FillReadingSchema, type FillRun, FillRunSchema } from './fill-run.entity.ts'
import {
  barOf,
  celsiusOf,
  EVACUATED_LIMIT_BAR_ABS,
  evaluateReading,
  formulaOf,
  nameOf,
  planNeedsOxygenClean,
  type RunState,
  readState,
  type StoredOption,
  type StoredStep,
  stepsFromPlan,
  toStepView,
  ventStep,
} from './runs.state.ts'

type RunListQueryParsed = z.output<typeof RunListQuerySchema>

const OPEN_STATUSES = ['ready', 'in-progress', 'paused'] as const
/** Plausible gas temperatures at the manifold, °C; a reading outside is a typing slip. */
const TEMPERATURE_RANGE_C = { min: -50, max: 100 }

type LoadedRun = FillRun & {
  plan: FillPlan & { orderLine: OrderLine & { order: Order } }
  cylinder: Cylinder
}

/** A run with its cylinder (the plan, line and order not loaded). */
type RunWithCylinder = FillRun & { cylinder: Cylinder }

/** What the run screen shows of a run's plan, order line and order. */
interface RunContext {
  planId: number
  planVersion: number
  description: string | null
  order: { id: number; number: string; status: OrderStatus } | null
}

function contextOf(run: LoadedRun): RunContext {
  const order = run.plan.orderLine?.order
  return {
    planId: run.plan.id,
    planVersion: run.plan.planVersion,
    description: run.plan.orderLine?.description ?? null,
    order: order ? { id: order.id, number: order.number, status: order.status as OrderStatus } : null,
  }
}

// ---- access ---------------------------------------------------------------------------------------------------

const isSupervisor = (user: SessionUser) => user.roles.includes('admin') || user.roles.includes('blender')

function canSee(user: SessionUser, run: FillRun): boolean {
  return isSupervisor(user) || user.roles.includes('qa') || (user.roles.includes('technician') && run.technicianId === user.id)
}

function canRecord(user: SessionUser, run: FillRun): boolean {
  return isSupervisor(user) || (user.roles.includes('technician') && run.technicianId === user.id)
}

/**
 * What a run is loaded with: its plan, order line, order and cylinder — without the plan's stored request and result
 * and the line's components and pricing. Those large JSON documents are read only when runs are created from a plan
 * (which loads the plan itself): the run carries its own targets. Left out, they are neither parsed on every load
 * nor compared at every flush.
 */
const RUN_POPULATE = ['plan', 'plan.orderLine', 'plan.orderLine.order', 'cylinder'] as never
const RUN_EXCLUDE = ['plan.request', 'plan.result', 'plan.orderLine.components', 'plan.orderLine.pricing'] as never

/** The plan, order line and order of a run as the run screen shows them: one plain query. */
async function runContext(em: EntityManager, run: FillRun): Promise<RunContext> {
  const planId = (run.plan as unknown as { id: number }).id
  const [row] = await rows<{ plan_version: number; description: string | null; order_id: number | null; number: string | null; status: string | null }>(
    em,
    'select p.plan_version, l.description, o.id as order_id, o.number, o.status from fill_plans p left join order_lines l on l.id = p.order_line_id left join orders o on o.id = l.order_id where p.id = ?',
    [planId],
  )
  if (!row) throw new Error(`Fill run ${run.id} refers to plan ${planId}, which is not in the database.`)
  return {
    planId,
    planVersion: Number(row.plan_version),
    description: row.description ?? null,
    order: row.order_id === null ? null : { id: Number(row.order_id), number: String(row.number), status: row.status as OrderStatus },
  }
}

/** The run if the user may see it (write access when `write`); 404 otherwise, so ids are not confirmed. */
async function loadRun(em: EntityManager, user: SessionUser, id: number, write = false): Promise<LoadedRun> {
  const run = await em.findOne(FillRunSchema, { id }, { populate: RUN_POPULATE, exclude: RUN_EXCLUDE })
  if (!run || !(write ? canRecord(user, run) : canSee(user, run))) throw new NotFoundError(`No fill run ${id} for you.`)
  return run as LoadedRun
}

// ---- DTOs -----------------------------------------------------------------------------------------------------

/** Plain rows of a read-only query (in the unit of work's transaction when there is one). */
const rows = <T>(em: EntityManager, sql: string, params: SqlParam[]): Promise<T[]> => readRows<T>(em, sql, params)

const placeholders = (n: number) => Array.from({ length: n }, () => '?').join(', ')

async function names(em: EntityManager, ids: (number | null | undefined)[]): Promise<Map<number, string>> {
  const wanted = [...new Set(ids.filter((x): x is number => typeof x === 'number'))]
  if (!wanted.length) return new Map()
  const users = await rows<{ id: number; name: string }>(em, `select id, name from users where id in (${placeholders(wanted.length)})`, wanted)
  return new Map(users.map((u) => [Number(u.id), u.name]))
}

/** A recorded reading as stored (the columns of fill_readings). */
interface ReadingRow {
  id: number
  step_index: number
  gas: string
  pressure_bar_abs: number | null
  pressure_bar_gauge: number | null
  temperature_c: number | null
  scale_kg: number | null
  outcome: FillReading['outcome']
  recorded_by_id: number
  /** epoch ms in SQLite, a timestamp in PostgreSQL */
  recorded_at: number | string | Date
}

/** The readings of a run, oldest first: plain rows (immutable records, nothing to track). */
function readingsOf(em: EntityManager, runId: number): Promise<ReadingRow[]> {
  return rows<ReadingRow>(
    em,
    'select id, step_index, gas, pressure_bar_abs, pressure_bar_gauge, temperature_c, scale_kg, outcome, recorded_by_id, recorded_at from fill_readings where run_id = ? order by id asc',
    [runId],
  )
}

const iso = (d: Date | string | null | undefined) => (d ? new Date(d).toISOString() : null)

const num = (v: number | string | null | undefined) => (v === null || v === undefined ? null : Number(v))
const dateOf = (v: number | string | Date) => new Date(typeof v === 'string' && /^\d+$/.test(v) ? Number(v) : v)

function toReadingDto(r: ReadingRow, nameOf: Map<number, string>): RunReading {
  const recordedById = Number(r.recorded_by_id)
  return {
    id: Number(r.id),
    stepIndex: Number(r.step_index),
    gas: r.gas,
    pressureBarAbs: num(r.pressure_bar_abs),
    pressureBarGauge: num(r.pressure_bar_gauge),
    temperatureC: num(r.temperature_c),
    scaleKg: num(r.scale_kg),
    outcome: r.outcome,
    recordedById,
    recordedBy: nameOf.get(recordedById) ?? null,
    recordedAt: dateOf(r.recorded_at).toISOString(),
  }
}

async function toRunDetail(
  em: EntityManager,
  user: SessionUser,
  run: RunWithCylinder,
  context: RunContext,
  state: RunState = readState(run.targets),
): Promise<RunDetail> {
  const readings = await readingsOf(em, run.id)
  const nameOf = await names(em, [run.technicianId, ...readings.map((r) => Number(r.recorded_by_id))])
  const order = context.order
  const c = run.cylinder
  return {
    id: run.id,
    status: run.status,
    version: run.version,
    currentStep: run.currentStep,
    stepCount: state.steps.length,
    allStepsDone: run.currentStep >= state.steps.length && !state.pending,
    replanCount: run.replanCount,
    method: state.method,
    atmosphericPressure: { value: state.atmosphericBar, unit: 'bar', reference: 'absolute' },
    fillTemperature: { value: state.fillTemperatureC, unit: 'C' },
    referenceTemperature: { value: state.referenceTemperatureC, unit: 'C' },
    finalGaugePressure: { value: state.finalGaugeBar, unit: 'bar', reference: 'gauge' },
    gaugeResolution: state.segments[0]?.request.gauge ? { value: barOf(state.segments[0].request.gauge.resolution), unit: 'bar' } : null,
    planId: context.planId,
    planVersion: context.planVersion,
    order: order ? { id: order.id, number: order.number, status: order.status } : null,
    description: context.description,
    cylinder: {
      id: c.id,
      serial: c.serial,
      barcode: c.barcode,
      waterVolumeL: c.waterVolumeL,
      servicePressureBar: c.servicePressureBar,
      testPressureBar: c.testPressureBar,
      oxygenClean: c.oxygenClean,
      valveOutlet: c.valveOutlet,
      nextTestDate: c.nextTestDate,
      status: c.status,
    },
    technician: run.technicianId ? { id: run.technicianId, name: nameOf.get(run.technicianId) ?? `User ${run.technicianId}` } : null,
    scheduledFor: run.scheduledFor,
    startedAt: iso(run.startedAt),
    completedAt: iso(run.completedAt),
    steps: state.steps.map((s, i) => toStepView(s, i, run.status === 'completed' ? state.steps.length : run.currentStep)),
    readings: readings.map((r) => toReadingDto(r, nameOf)),
    pendingReplan: state.pending?.view ?? null,
    canRecord: canRecord(user, run),
    notes: [...state.notices, ...(run.notes ? [run.notes] : [])].join('\n'),
  }
}

function toSummary(run: LoadedRun, nameOf: Map<number, string>): RunSummary {
  const state = readState(run.targets)
  const step = state.steps[run.currentStep]
  const order = run.plan.orderLine?.order
  return {
    id: run.id,
    status: run.status,
    version: run.version,
    scheduledFor: run.scheduledFor,
    currentStep: run.currentStep,
    stepCount: state.steps.length,
    cylinder: { id: run.cylinder.id, serial: run.cylinder.serial, barcode: run.cylinder.barcode, waterVolumeL: run.cylinder.waterVolumeL },
    orderNumber: order?.number ?? null,
    description: run.plan.orderLine?.description ?? null,
    technician: run.technicianId ? { id: run.technicianId, name: nameOf.get(run.technicianId) ?? `User ${run.technicianId}` } : null,
    next:
      step && run.status !== 'completed' && run.status !== 'aborted'
        ? {
            label: step.label,
            formula: step.kind === 'add' ? formulaOf(step.gas) : null,
            cumulativeGaugePressure: { value: step.cumulativeGaugeBar, unit: 'bar', reference: 'gauge' },
          }
        : null,
    needsReplanConfirmation: !!state.pending,
  }
}

async function summaries(em: EntityManager, runs: LoadedRun[]): Promise<RunSummary[]> {
  const nameOf = await names(
    em,
    runs.map((r) => r.technicianId),
  )
  return runs.map((r) => toSummary(r, nameOf))
}

/** 409 carrying the run as it is now, so the tablet shows the fresh state. */
async function staleConflict(em: EntityManager, user: SessionUser, id: number, message: string): Promise<ConflictError> {
  const fresh = em.fork()
  const run = await loadRun(fresh, user, id)
  return new ConflictError(message, { current: await toRunDetail(fresh, user, run, contextOf(run)) })
}

// ---- creating runs from an approved plan ----------------------------------------------------------------------

function parsePlan(plan: FillPlan): { request: FillPlanRequest; result: FillPlanCoreResponse } {
  const request = FillPlanRequestSchema.safeParse(plan.request)
  const result = FillPlanResponseSchema.safeParse(plan.result)
  if (!request.success || !result.success || result.data.steps.length === 0) {
    throw new UnprocessableError(`Plan ${plan.id} has no computed steps to fill from; recompute it in the plan workspace.`, [
      { field: 'planId', message: 'No computed steps.' },
    ])
  }
  return { request: request.data, result: result.data }
}

function initialState(plan: FillPlan, request: FillPlanRequest, result: FillPlanCoreResponse, c: Cylinder): RunState {
  const atm = barOf(result.atmosphericPressure)
  // the plan may have been computed before the cylinder was chosen: re-planning uses this cylinder's limits
  const request0: FillPlanRequest = {
    ...request,
    cylinder: {
      ...request.cylinder,
      servicePressure: { value: c.servicePressureBar, unit: 'bar', reference: 'gauge' },
      testPressure: { value: c.testPressureBar, unit: 'bar', reference: 'gauge' },
      oxygenClean: c.oxygenClean,
      nextTestDate: c.nextTestDate,
    },
    proposePremix: false,
  }
  const notices: string[] = []
  const planResidual = request.cylinder.residual?.kind ?? 'evacuated'
  const recorded = c.residual?.kind ?? 'evacuated'
  if (planResidual === 'evacuated' && recorded === 'residual') {
    notices.push(
      `The cylinder record shows ${c.residual.pressureBarGauge ?? 0} bar (gauge) of residual gas, but the plan expects an evacuated cylinder: vent and evacuate it before the first addition.`,
    )
  }
  if (planResidual === 'residual' && recorded === 'evacuated') {
    notices.push(
      'The plan counts residual gas in this cylinder, but the record says it is evacuated: check the gauge with the blender before the first addition.',
    )
  }
  return {
    schema: 1,
    method: result.method,
    atmosphericBar: atm,
    fillTemperatureC: celsiusOf(result.fillTemperature),
    referenceTemperatureC: celsiusOf(result.referenceTemperature),
    finalGaugeBar: barOf(result.finalGaugePressure),
    segments: [{ origin: 'plan', request: request0, firstStep: 0, confirmedById: plan.approvedById ?? null, confirmedAt: iso(plan.approvedAt), verdict: null }],
    steps: stepsFromPlan(result, 0, null),
    pending: null,
    notices,
  }
}

/**
 * Books cylinders for an approved plan: one fill run per cylinder, assigned to a technician for a date. Checks the
 * plan (approved, computed, not blocked), the technician, and each cylinder: periodic test valid on the date (422),
 * free (409), oxygen-clean where the plan needs it, the plan's water volume, and service pressure ≥ the final fill
 * pressure. Cylinders become 'reserved'. Runs in the caller's transaction when there is one, else in its own.
 */
export async function createRunsForPlan(
  em: EntityManager,
  user: SessionUser,
  planId: number,
  cylinderIds: number[],
  technicianId: number,
  scheduledFor: string,
): Promise<RunSummary[]> {
  const work = async (tx: EntityManager): Promise<RunSummary[]> => {
    const plan = await tx.findOne(FillPlanSchema, { id: planId }, { populate: ['orderLine', 'orderLine.order'] as never })
    if (!plan) throw new NotFoundError(`No fill plan ${planId}.`)
    if (plan.status !== 'approved') {
      throw new UnprocessableError(`Plan ${planId} (version ${plan.planVersion}) is ${plan.status}: only an approved plan goes to the manifold.`, [
        { field: 'planId', message: 'Approve the plan first.' },
      ])
    }
    if (plan.blocking)
      throw new UnprocessableError(`Plan ${planId} has a blocking safety finding and cannot be filled.`, [{ field: 'planId', message: 'Blocked plan.' }])
    const { request, result } = parsePlan(plan)
    if (new Set(cylinderIds).size !== cylinderIds.length)
      throw new UnprocessableError('A cylinder is listed twice.', [{ field: 'cylinderIds', message: 'Each cylinder once.' }])
    const tech = await tx.findOne(UserSchema, { id: technicianId })
    if (!tech?.active || !tech.roles.includes('technician')) {
      throw new UnprocessableError(`User ${technicianId} is not an active technician.`, [{ field: 'technicianId', message: 'Choose a technician.' }])
    }
    const line = plan.orderLine as OrderLine & { order: Order }
    const booked = await tx.count(FillRunSchema, { plan: { orderLine: line.id }, status: { $ne: 'aborted' } })
    if (booked + cylinderIds.length > line.quantity) {
      throw new UnprocessableError(
        `Order line ${line.lineNo} asks for ${line.quantity} cylinder(s); ${booked} already booked, ${cylinderIds.length} more would be too many.`,
        [{ field: 'cylinderIds', message: `At most ${Math.max(0, line.quantity - booked)} more.` }],
      )
    }
    const planVolumeL =
      request.cylinder.waterVolume.unit === 'L'
        ? request.cylinder.waterVolume.value
        : request.cylinder.waterVolume.unit === 'm3'
          ? request.cylinder.waterVolume.value * 1000
          : request.cylinder.waterVolume.value * 28.316846592
    const needsO2Clean = planNeedsOxygenClean(result)
    const finalGaugeBar = barOf(result.finalGaugePressure)
    const created: FillRun[] = []
    for (const [i, cylinderId] of cylinderIds.entries()) {
      const field = `cylinderIds.${i}`
      const c = await tx.findOne(CylinderSchema, { id: cylinderId })
      if (!c) throw new UnprocessableError(`No cylinder ${cylinderId}.`, [{ field, message: 'Unknown cylinder.' }])
      assertCylinderUsable(c, scheduledFor)
      const open = await tx.count(FillRunSchema, { cylinder: c.id, status: { $in: [...OPEN_STATUSES] } })
      if (open > 0 || c.status !== 'available') {
        throw new ConflictError(`Cylinder ${c.serial} is not free (${c.status}${open > 0 ? ', booked for another fill' : ''}).`, {
          errors: [{ field, message: 'Not free.' }],
        })
      }
      if (needsO2Clean && !c.oxygenClean) {
        throw new UnprocessableError(`Cylinder ${c.serial} is not oxygen-clean; this plan puts oxygen above 23.5 % in it.`, [
          { field, message: 'Needs an oxygen-clean cylinder.' },
        ])
      }
      if (Math.abs(c.waterVolumeL - planVolumeL) > 0.01 * planVolumeL) {
        throw new UnprocessableError(`Cylinder ${c.serial} holds ${c.waterVolumeL} L; the plan was computed for ${planVolumeL} L. Re-plan for this cylinder.`, [
          { field, message: 'Water volume differs from the plan.' },
        ])
      }
      if (finalGaugeBar > c.servicePressureBar * (1 + 1e-9)) {
        throw new UnprocessableError(
          `Cylinder ${c.serial} is marked for ${c.servicePressureBar} bar; the plan fills to ${finalGaugeBar.toFixed(1)} bar (gauge).`,
          [{ field, message: 'Service pressure below the fill pressure.' }],
        )
      }
      const run = tx.create(FillRunSchema, {
        plan,
        cylinder: c,
        technicianId,
        scheduledFor,
        status: 'ready',
        currentStep: 0,
        targets: initialState(plan, request, result, c) as unknown as Record<string, unknown>,
        replanCount: 0,
        notes: '',
      })
      c.status = 'reserved'
      created.push(run)
    }
    await tx.flush()
    for (const run of created) audit(tx, user, 'run.create', 'FillRun', run.id, { planId, cylinderId: run.cylinder.id, technicianId, scheduledFor })
    await tx.flush()
    return summaries(tx, created as LoadedRun[])
  }
  return em.isInTransaction() ? work(em) : em.transactional(work)
}

// ---- reading lists -------------------------------------------------------------------------------------------

const STATUS_RANK: Record<string, number> = { 'in-progress': 0, paused: 1, ready: 2, completed: 3, aborted: 4 }

/** "My fills today": the user's runs for the date, plus unfinished runs from earlier days. */
export async function listMyRuns(em: EntityManager, user: SessionUser, date: string = localIsoDate()): Promise<RunSummary[]> {
  const runs = (await em.find(
    FillRunSchema,
    { technicianId: user.id, $or: [{ scheduledFor: date }, { scheduledFor: { $lt: date }, status: { $in: [...OPEN_STATUSES] } }] },
    { populate: RUN_POPULATE, exclude: RUN_EXCLUDE, orderBy: { scheduledFor: 'asc', id: 'asc' } },
  )) as LoadedRun[]
  runs.sort((a, b) => STATUS_RANK[a.status] - STATUS_RANK[b.status] || a.scheduledFor.localeCompare(b.scheduledFor) || a.id - b.id)
  return summaries(em, runs)
}

export async function listRuns(em: EntityManager, query: RunListQueryParsed): Promise<RunSummary[]> {
  const where: Record<string, unknown> = {}
  if (query.date) where.scheduledFor = query.date
  if (query.status) where.status = query.status
  if (query.technicianId) where.technicianId = query.technicianId
  if (query.planId) where.plan = query.planId
  const runs = (await em.find(FillRunSchema, where, {
    populate: RUN_POPULATE,
    exclude: RUN_EXCLUDE,
    orderBy: { scheduledFor: 'desc', id: 'desc' },
    limit: 500,
  })) as LoadedRun[]
  return summaries(em, runs)
}

/** The open run of a scanned cylinder that the user may work on. */
export async function lookupRunByBarcode(em: EntityManager, user: SessionUser, barcode: string): Promise<RunSummary> {
  const code = barcode.trim()
  const c = await em.findOne(CylinderSchema, { $or: [{ barcode: code }, { serial: code }] })
  if (!c) throw new NotFoundError(`No cylinder with barcode "${code}".`)
  const runs = (await em.find(
    FillRunSchema,
    { cylinder: c.id, status: { $in: [...OPEN_STATUSES] } },
    { populate: RUN_POPULATE, exclude: RUN_EXCLUDE, orderBy: { id: 'desc' } },
  )) as LoadedRun[]
  const mine = runs.find((r) => canRecord(user, r))
  if (!mine) throw new NotFoundError(`Cylinder ${c.serial} has no open fill assigned to you.`)
  return (await summaries(em, [mine]))[0]
}

export async function getRunDetail(em: EntityManager, user: SessionUser, id: number): Promise<RunDetail> {
  const run = await loadRun(em, user, id)
  return toRunDetail(em, user, run, contextOf(run))
}

// ---- order progress -------------------------------------------------------------------------------------------

async function moveOrder(em: EntityManager, user: SessionUser, order: { id: number; status: string }, to: OrderStatus): Promise<void> {
  const path: OrderStatus[] = to === 'filling' ? ['filling'] : ['filling', 'analysis']
  const fresh = order
  for (const next of path) {
    if (fresh.status === next) continue
    if (next === 'filling' && fresh.status !== 'planned') continue
    if (next === 'analysis' && fresh.status !== 'filling') continue
    const moved = await transitionOrder(em, user, fresh.id, next)
    fresh.status = moved.status
  }
}

/** The order goes to analysis when every line has its quantity of finished runs and nothing is still open. */
async function orderFilled(em: EntityManager, order: Order): Promise<boolean> {
  const lines = await em.find(OrderLineSchema, { order: order.id })
  const runs = await em.find(FillRunSchema, { plan: { orderLine: { $in: lines.map((l) => l.id) } } }, { populate: ['plan'] as never })
  if (runs.some((r) => (OPEN_STATUSES as readonly string[]).includes(r.status))) return false
  return lines.every((l) => runs.filter((r) => r.status === 'completed' && (r.plan as FillPlan).orderLine.id === l.id).length >= l.quantity)
}

// ---- recording ------------------------------------------------------------------------------------------------

function lastReadingPerStep(readings: FillReading[]): Map<number, FillReading> {
  const map = new Map<number, FillReading>()
  for (const r of readings) map.set(r.stepIndex, r)
  return map
}

function sourcesWithIds(request: FillPlanRequest): FillPlanRequest['sources'] {
  return request.sources.map((s, i) => ({ ...s, id: s.id ?? (s.composition ? `premix-${i + 1}` : s.gas) }))
}

/** Runs the planner's re-plan for the segment of an overshot step and keeps the options for confirmation. */
function computePending(state: RunState, stepIndex: number, readingId: number, readings: Map<number, FillReading>): RunState['pending'] {
  const step = state.steps[stepIndex]
  const segment = state.segments[step.segment]
  const segmentSteps = state.steps.map((s, i) => ({ s, i })).filter(({ s, i }) => s.segment === step.segment && s.kind === 'add' && i <= stepIndex)
  const gravimetric = state.method === 'gravimetric'
  const actuals = segmentSteps.flatMap(({ s, i }): ReplanRequest['actuals'] => {
    const r = readings.get(i)
    if (!r || s.segmentStep === null) return []
    if (gravimetric && r.scaleKg !== null && r.scaleKg !== undefined)
      return [{ stepIndex: s.segmentStep, scaleMass: { value: r.scaleKg, unit: 'kg' as const } }]
    return [
      {
        stepIndex: s.segmentStep,
        pressure: { value: r.pressureBarAbs ?? 0, unit: 'bar' as const, reference: 'absolute' as const },
        temperature: { value: r.temperatureC ?? state.fillTemperatureC, unit: 'C' as const },
      },
    ]
  })
  const now = new Date().toISOString()
  let resp: ReplanResponse
  try {
    resp = replanFromRequest({ plan: segment.request, actuals })
  } catch (error) {
    const message = error instanceof PlanningInputError || error instanceof RangeError ? error.message : 'the planner could not evaluate the readings'
    return {
      view: {
        stepIndex,
        readingId,
        status: 'failed',
        verdict: `The re-plan could not be computed (${message}). Pause the run and ask the blender before adding more gas.`,
        composition: [],
        gaugePressureAtFillTemperature: null,
        options: [],
        warnings: [],
        computedAt: now,
      },
      composition: step.compositionAfter,
      options: [],
    }
  }
  const composition = resp.composition.map((c) => ({ gas: c.gas, fraction: c.fraction }))
  const residualNow = {
    kind: 'residual' as const,
    pressure: { ...resp.pressureAtFillTemperature },
    temperature: { ...segment.request.fillTemperature },
    composition,
  }
  const withResidual = (residual: NonNullable<FillPlanRequest['cylinder']['residual']>, extra: Partial<FillPlanRequest> = {}): FillPlanRequest => ({
    ...segment.request,
    cylinder: { ...segment.request.cylinder, residual },
    proposePremix: false,
    ...extra,
  })
  const sources = sourcesWithIds(segment.request)
  const done = (step.segmentStep ?? 0) + 1
  const remainingSourceIds = state.steps.filter((s) => s.segment === step.segment && s.kind === 'add' && (s.segmentStep ?? -1) >= done).map((s) => s.source)
  const options: StoredOption[] = resp.options.map((o) => {
    switch (o.kind) {
      case 'continue':
        return {
          kind: o.kind,
          request: withResidual(residualNow, {
            sources: remainingSourceIds.map((id) => sources.find((s) => s.id === id) ?? { gas: id ?? '' }),
            order: 'as-given',
          }),
          plan: o.plan ?? null,
          ventToAbsBar: null,
        }
      case 'top-up':
        return {
          kind: o.kind,
          request: withResidual(residualNow, { finalPressure: o.finalGaugePressure ?? segment.request.finalPressure, order: 'auto' }),
          plan: o.plan ?? null,
          ventToAbsBar: null,
        }
      case 'vent': {
        const ventTo = o.ventToGaugePressure ?? resp.gaugePressureAtFillTemperature
        return {
          kind: o.kind,
          request: withResidual({ ...residualNow, pressure: ventTo }, { order: 'auto' }),
          plan: o.plan ?? null,
          ventToAbsBar: barOf(ventTo) + state.atmosphericBar,
        }
      }
      case 'remake':
        return { kind: o.kind, request: withResidual({ kind: 'evacuated' }), plan: o.plan ?? null, ventToAbsBar: EVACUATED_LIMIT_BAR_ABS }
      default:
        return { kind: o.kind, request: null, plan: null, ventToAbsBar: null }
    }
  })
  const atm = state.atmosphericBar
  const bar = (abs: number) => ({ value: abs - atm, unit: 'bar' as const, reference: 'gauge' as const })
  const targets = new Map(segment.request.target.map((t) => [t.gas, t.fraction]))
  const view: PendingReplan = {
    stepIndex,
    readingId,
    status: resp.status,
    verdict: resp.verdict,
    composition: composition.map((c) => ({ ...c, formula: formulaOf(c.gas), target: targets.get(c.gas) ?? null })),
    gaugePressureAtFillTemperature: bar(barOf(resp.pressureAtFillTemperature)),
    options: resp.options.map((o, i) => ({
      kind: o.kind,
      description: o.description,
      finalGaugePressure: o.finalGaugePressure ? bar(barOf(o.finalGaugePressure) + atm) : null,
      ventToGaugePressure: options[i].ventToAbsBar !== null ? bar(options[i].ventToAbsBar as number) : null,
      steps: (o.plan?.steps ?? []).map((s) => ({
        gas: s.gas,
        label: nameOf(s.gas),
        formula: formulaOf(s.gas),
        cumulativeGaugePressure: bar(barOf(s.cumulativePressure)),
      })),
    })),
    warnings: resp.warnings.map((w) => ({ code: w.code, severity: w.severity, message: w.message })),
    computedAt: now,
  }
  return { view, composition, options }
}

/** After a vent or evacuate step: the plan of the segment recomputed from the pressure actually left. */
function replanAfterVent(state: RunState, stepIndex: number, readingId: number, pressureAbsBar: number, temperatureC: number): RunState {
  const step = state.steps[stepIndex]
  const segment = state.segments[step.segment]
  const residual = {
    kind: 'residual' as const,
    pressure: { value: pressureAbsBar, unit: 'bar' as const, reference: 'absolute' as const },
    temperature: { value: temperatureC, unit: 'C' as const },
    composition: step.compositionAfter,
  }
  const request: FillPlanRequest = { ...segment.request, cylinder: { ...segment.request.cylinder, residual }, proposePremix: false }
  try {
    const plan = fillPlanFromRequest(request)
    const segments = state.segments.map((s, i) => (i === step.segment ? { ...s, request } : s))
    const steps = [...state.steps.slice(0, stepIndex + 1), ...stepsFromPlan(plan, step.segment, 'Targets recomputed from the pressure left after venting.')]
    return { ...state, segments, steps }
  } catch (error) {
    const message = error instanceof PlanningInputError || error instanceof RangeError ? error.message : 'the planner could not plan from the vented cylinder'
    const remakeRequest: FillPlanRequest = {
      ...segment.request,
      cylinder: { ...segment.request.cylinder, residual: { kind: 'evacuated' } },
      proposePremix: false,
    }
    let remakePlan: FillPlanCoreResponse | null = null
    try {
      remakePlan = fillPlanFromRequest(remakeRequest)
    } catch {
      remakePlan = null
    }
    const atm = state.atmosphericBar
    const gauge = (abs: number) => ({ value: abs - atm, unit: 'bar' as const, reference: 'gauge' as const })
    return {
      ...state,
      pending: {
        view: {
          stepIndex,
          readingId,
          status: 'failed',
          verdict: `No plan reaches the ordered mixture from what is left in the cylinder (${message}).`,
          composition: step.compositionAfter.map((c) => ({ ...c, formula: formulaOf(c.gas), target: null })),
          gaugePressureAtFillTemperature: gauge(pressureAbsBar),
          options: remakePlan
            ? [
                {
                  kind: 'remake',
                  description: 'Vent, evacuate and make the cylinder again from the start.',
                  finalGaugePressure: null,
                  ventToGaugePressure: gauge(EVACUATED_LIMIT_BAR_ABS),
                  steps: remakePlan.steps.map((s) => ({
                    gas: s.gas,
                    label: nameOf(s.gas),
                    formula: formulaOf(s.gas),
                    cumulativeGaugePressure: gauge(barOf(s.cumulativePressure)),
                  })),
                },
              ]
            : [],
          warnings: [],
          computedAt: new Date().toISOString(),
        },
        composition: step.compositionAfter,
        options: remakePlan ? [{ kind: 'remake', request: remakeRequest, plan: remakePlan, ventToAbsBar: EVACUATED_LIMIT_BAR_ABS }] : [],
      },
    }
  }
}

function checkVersion(run: FillRun, expectedVersion: number): void {
  if (run.version !== expectedVersion) throw new StaleVersion()
}
class StaleVersion extends Error {}

/**
 * Records one reading on the current step. Idempotent by clientRequestId (a retry returns the first answer);
 * a stale expectedVersion or another step than the current one is 409 with the run as it is now. The outcome
 * is decided at the measured temperature; an 'over' reading triggers the re-plan, which the technician must
 * confirm before anything else is recorded.
 */
export async function recordReading(em: EntityManager, user: SessionUser, id: number, input: RecordReadingInput): Promise<RecordReadingResult> {
  const replay = async (): Promise<RecordReadingResult | null> => {
    const fresh = em.fork()
    const [existing] = await rows<{ id: number; run_id: number }>(fresh, 'select id, run_id from fill_readings where client_request_id = ?', [
      input.clientRequestId,
    ])
    if (!existing) return null
    if (Number(existing.run_id) !== id) {
      throw new ConflictError('This reading id was already used on another run; the tablet must make a new one.', {
        errors: [{ field: 'clientRequestId', message: 'Already used.' }],
      })
    }
    const run = await loadRun(fresh, user, id, true)
    const detail = await toRunDetail(fresh, user, run, contextOf(run))
    return { run: detail, reading: detail.readings.find((r) => r.id === Number(existing.id)) as RunReading, replayed: true }
  }
  const first = await replay()
  if (first) return first

  try {
    return await em.transactional(async (tx): Promise<RecordReadingResult> => {
      // the run and its cylinder are what this changes; of the plan, line and order only what the answer shows
      const run = (await tx.findOne(FillRunSchema, { id }, { populate: ['cylinder'] as never })) as RunWithCylinder | null
      if (!run || !canRecord(user, run)) throw new NotFoundError(`No fill run ${id} for you.`)
      const context = await runContext(tx, run)
      checkVersion(run, input.expectedVersion)
      if (run.status === 'paused') throw new ConflictError('The run is paused: resume it before recording.')
      if (run.status === 'completed' || run.status === 'aborted') throw new ConflictError(`The run is ${run.status}; nothing more can be recorded on it.`)
      let state = readState(run.targets)
      if (state.pending) throw new ConflictError('A re-plan is waiting: confirm the new targets before recording more.')
      if (input.stepIndex !== run.currentStep) throw new StaleVersion()
      const step: StoredStep | undefined = state.steps[input.stepIndex]
      if (!step) throw new ConflictError('Every step is recorded: finish the run.')

      const atm = state.atmosphericBar
      const given = toBar(input.pressure.value, input.pressure.unit)
      const pressureAbsBar = input.pressure.reference === 'absolute' ? given : given + atm
      const temperatureC = toCelsius(input.temperature.value, input.temperature.unit)
      if (temperatureC < TEMPERATURE_RANGE_C.min || temperatureC > TEMPERATURE_RANGE_C.max) {
        throw new UnprocessableError(`${temperatureC.toFixed(1)} °C is not a gas temperature at the manifold; check the thermometer reading.`, [
          { field: 'temperature.value', message: `Between ${TEMPERATURE_RANGE_C.min} and ${TEMPERATURE_RANGE_C.max} °C.` },
        ])
      }
      if (pressureAbsBar < 0) {
        throw new UnprocessableError('That pressure is below vacuum; check gauge or absolute.', [{ field: 'pressure.value', message: 'Below vacuum.' }])
      }
      if (pressureAbsBar - atm > run.cylinder.testPressureBar) {
        throw new UnprocessableError(
          `${(pressureAbsBar - atm).toFixed(1)} bar (gauge) is above the cylinder's test pressure of ${run.cylinder.testPressureBar} bar. Check the reading; if it is real, stop filling, close the valves and call the blender.`,
          [{ field: 'pressure.value', message: 'Above the test pressure.' }],
        )
      }
      const scaleKg = input.scaleMass ? input.scaleMass.value * KG_PER_MASS_UNIT[input.scaleMass.unit] : null
      const evaluation = evaluateReading(step, state, pressureAbsBar, temperatureC, scaleKg)
      const reading = tx.create(FillReadingSchema, {
        run,
        stepIndex: input.stepIndex,
        gas: step.gas.slice(0, 64),
        pressureBarAbs: pressureAbsBar,
        pressureBarGauge: pressureAbsBar - atm,
        temperatureC,
        scaleKg,
        outcome: evaluation.outcome,
        supersedes: null,
        recordedById: user.id,
        clientRequestId: input.clientRequestId,
      })
      await tx.flush()

      // every change to the run is made before the next flush, so its version goes up by exactly one
      const starting = run.status === 'ready'
      if (starting) {
        run.status = 'in-progress'
        run.startedAt = new Date()
        run.cylinder.status = 'filling'
      }
      if (evaluation.outcome === 'on-target') {
        if (step.kind !== 'add') state = replanAfterVent(state, input.stepIndex, reading.id, pressureAbsBar, temperatureC)
        if (!state.pending) run.currentStep = input.stepIndex + 1
      } else if (evaluation.outcome === 'over' && step.kind === 'add') {
        const readings = await tx.find(FillReadingSchema, { run: run.id }, { orderBy: { id: 'asc' } })
        state = { ...state, pending: computePending(state, input.stepIndex, reading.id, lastReadingPerStep(readings)) }
      }
      run.targets = state as unknown as Record<string, unknown>
      audit(tx, user, 'run.reading', 'FillRun', run.id, { readingId: reading.id, stepIndex: input.stepIndex, outcome: evaluation.outcome })
      await tx.flush()
      if (starting && context.order) await moveOrder(tx, user, context.order, 'filling')
      // the answer is the run as this transaction leaves it, without loading it again: the state as stored (read
      // back from its JSON), the readings and names read inside the transaction — what it commits
      const detail = await toRunDetail(tx, user, run, context, readState(JSON.parse(JSON.stringify(run.targets))))
      return { run: detail, reading: detail.readings.find((r) => r.id === reading.id) as RunReading, replayed: false }
    })
  } catch (error) {
    if (error instanceof StaleVersion || error instanceof OptimisticLockError) {
      throw await staleConflict(em, user, id, 'Someone else recorded on this run first (another tablet?). The screen now shows the current step.')
    }
    if (error instanceof UniqueConstraintViolationException) {
      const again = await replay()
      if (again) return again
    }
    throw error
  }
}

// ---- pause, resume, re-plan confirmation, completion -----------------------------------------------------------

async function change(
  em: EntityManager,
  user: SessionUser,
  id: number,
  expectedVersion: number,
  apply: (run: LoadedRun, tx: EntityManager) => Promise<void> | void,
): Promise<RunDetail> {
  try {
    await em.transactional(async (tx) => {
      const run = await loadRun(tx, user, id, true)
      checkVersion(run, expectedVersion)
      await apply(run, tx)
      await tx.flush()
    })
  } catch (error) {
    if (error instanceof StaleVersion || error instanceof OptimisticLockError) {
      throw await staleConflict(em, user, id, 'The run was changed on another screen first. The screen now shows its current state.')
    }
    throw error
  }
  const fresh = em.fork()
  const run = await loadRun(fresh, user, id)
  return toRunDetail(fresh, user, run, contextOf(run))
}

export function pauseRun(em: EntityManager, user: SessionUser, id: number, input: RunVersionInput): Promise<RunDetail> {
  return change(em, user, id, input.expectedVersion, (run, tx) => {
    if (run.status !== 'ready' && run.status !== 'in-progress') throw new ConflictError(`The run is ${run.status}; only a run not finished can be paused.`)
    run.status = 'paused'
    if (input.note) run.notes = `${run.notes ? `${run.notes}\n` : ''}Paused: ${input.note}`
    audit(tx, user, 'run.pause', 'FillRun', run.id, { note: input.note ?? null })
  })
}

export function resumeRun(em: EntityManager, user: SessionUser, id: number, input: RunVersionInput): Promise<RunDetail> {
  return change(em, user, id, input.expectedVersion, (run, tx) => {
    if (run.status !== 'paused') throw new ConflictError(`The run is ${run.status}, not paused.`)
    run.status = run.startedAt ? 'in-progress' : 'ready'
    audit(tx, user, 'run.resume', 'FillRun', run.id)
  })
}

/** Applies the option the technician chose after an overshoot: new targets, a top-up, a vent or a remake. */
export function confirmReplan(em: EntityManager, user: SessionUser, id: number, input: ConfirmReplanInput): Promise<RunDetail> {
  return change(em, user, id, input.expectedVersion, (run, tx) => {
    if (run.status === 'paused') throw new ConflictError('The run is paused: resume it first.')
    const state = readState(run.targets)
    const pending = state.pending
    if (!pending) throw new ConflictError('No re-plan is waiting for confirmation.')
    const chosen = pending.options.find((o) => o.kind === input.option)
    if (!chosen) {
      throw new UnprocessableError(
        `"${input.option}" is not one of the options of this re-plan (${pending.options.map((o) => o.kind).join(', ') || 'none'}).`,
        [{ field: 'option', message: 'Not offered.' }],
      )
    }
    const s = pending.view.stepIndex
    const segment = state.segments.length
    const kept = state.steps.slice(0, s + 1)
    const atStep = `after step ${s + 1}`
    const newSegment = (origin: StoredOption['kind']) => ({
      origin,
      request: chosen.request as FillPlanRequest,
      firstStep: s + 1,
      confirmedById: user.id,
      confirmedAt: new Date().toISOString(),
      verdict: pending.view.verdict,
    })
    let next: RunState
    if (chosen.kind === 'accept') {
      next = { ...state, steps: kept, pending: null }
    } else if (!chosen.plan || !chosen.request) {
      throw new UnprocessableError('This option has no computed targets; pause the run and ask the blender.')
    } else if (chosen.kind === 'continue' || chosen.kind === 'top-up') {
      const note = chosen.kind === 'continue' ? `New targets ${atStep} (re-planned).` : `Top-up targets ${atStep} (re-planned to a higher final pressure).`
      next = { ...state, segments: [...state.segments, newSegment(chosen.kind)], steps: [...kept, ...stepsFromPlan(chosen.plan, segment, note)], pending: null }
      if (chosen.kind === 'top-up') next.finalGaugeBar = barOf(chosen.plan.finalGaugePressure)
    } else {
      const kind = chosen.kind === 'vent' ? 'vent' : 'evacuate'
      const limit = chosen.ventToAbsBar ?? EVACUATED_LIMIT_BAR_ABS
      const note =
        chosen.kind === 'vent' ? `Vent ${atStep}: composition unchanged, then refill.` : `Remake ${atStep}: vent and evacuate, then fill from the start.`
      next = {
        ...state,
        segments: [...state.segments, newSegment(chosen.kind)],
        steps: [
          ...kept,
          ventStep(kind, limit, state.atmosphericBar, segment, pending.composition, note),
          ...stepsFromPlan(chosen.plan, segment, 'Provisional targets: recomputed from your reading after venting.'),
        ],
        pending: null,
      }
      if (chosen.kind === 'remake') next.finalGaugeBar = barOf(chosen.plan.finalGaugePressure)
    }
    run.targets = next as unknown as Record<string, unknown>
    run.currentStep = s + 1
    run.replanCount += 1
    audit(tx, user, 'run.replan', 'FillRun', run.id, { option: chosen.kind, afterStep: s, verdict: pending.view.verdict })
  })
}

/** Finishes a run whose steps are all recorded: cylinder to analysis, and the order when all its fills are done. */
export function completeRun(em: EntityManager, user: SessionUser, id: number, input: RunVersionInput): Promise<RunDetail> {
  return change(em, user, id, input.expectedVersion, async (run, tx) => {
    if (run.status !== 'in-progress') throw new ConflictError(`The run is ${run.status}; only a run being filled can be finished.`)
    const state = readState(run.targets)
    if (state.pending) throw new ConflictError('A re-plan is waiting: confirm it first.')
    const left = state.steps.length - run.currentStep
    if (left > 0) throw new ConflictError(`${left} step(s) still to record before the run can be finished.`)
    run.status = 'completed'
    run.completedAt = new Date()
    run.cylinder.status = 'awaiting-analysis'
    if (input.note) run.notes = `${run.notes ? `${run.notes}\n` : ''}${input.note}`
    audit(tx, user, 'run.complete', 'FillRun', run.id, { cylinderId: run.cylinder.id })
    await tx.flush()
    const order = run.plan.orderLine?.order
    if (order && (await orderFilled(tx, order))) await moveOrder(tx, user, order, 'analysis')
  })
}

/** Moves a run not yet finished to another technician or day. */
export function reassignRun(em: EntityManager, user: SessionUser, id: number, input: ReassignRunInput): Promise<RunDetail> {
  return change(em, user, id, input.expectedVersion, async (run, tx) => {
    if (run.status !== 'ready' && run.status !== 'paused')
      throw new ConflictError(`The run is ${run.status}; only a run not started or paused can be reassigned.`)
    const tech = await tx.findOne(UserSchema, { id: input.technicianId })
    if (!tech?.active || !tech.roles.includes('technician')) {
      throw new UnprocessableError(`User ${input.technicianId} is not an active technician.`, [{ field: 'technicianId', message: 'Choose a technician.' }])
    }
    assertCylinderUsable(run.cylinder, input.scheduledFor)
    const before = { technicianId: run.technicianId, scheduledFor: run.scheduledFor }
    run.technicianId = input.technicianId
    run.scheduledFor = input.scheduledFor
    audit(tx, user, 'run.reassign', 'FillRun', run.id, { before, after: { technicianId: input.technicianId, scheduledFor: input.scheduledFor } })
  })
}
