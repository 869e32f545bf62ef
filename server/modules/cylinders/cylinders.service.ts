import type { EntityManager, FilterQuery } from '@mikro-orm/core'
import type { SessionUser } from '#shared/schemas/auth.ts'
import {
  addDaysIso,
  type Cylinder as CylinderDto,
  type CylinderHistory,
  type CylinderInputParsed,
  type CylinderListQuery,
  CylinderListQuerySchema,
  type CylinderList,
  type CylinderOwnerOption,
  type CylinderUpdate,
  localIsoDate,
  TEST_DUE_SOON_DAYS,
  testStateOn,
} from '#shared/schemas/cylinder.ts'
import { audit } from '../../lib/audit.ts'
import { ConflictError, NotFoundError, UnprocessableError } from '../../lib/http-errors.ts'
import { CustomerSchema } from '../customers/customer.entity.ts'
import { FillReadingSchema, FillRunSchema } from '../runs/fill-run.entity.ts'
import { UserSchema } from '../users/user.entity.ts'
import { type Cylinder, CylinderSchema } from './cylinder.entity.ts'

/** States in which a cylinder is out of use whatever its test date says. */
const OUT_OF_USE: Partial<Record<string, string>> = {
  quarantine: 'it is held back (quarantine)',
  retired: 'it is out of service (retired)',
}

export interface CylinderBlock {
  blocked: boolean
  reason: string | null
}

/**
 * Whether a cylinder may be booked for a fill or planned on a date. A cylinder past its next periodic test
 * date must not be filled (49 CFR 180.205; ADR P200 test periods); quarantined and retired cylinders neither.
 */
export function cylinderBlock(c: Pick<Cylinder, 'serial' | 'nextTestDate' | 'status'>, onDate: string = localIsoDate()): CylinderBlock {
  if (c.nextTestDate < onDate) {
    return { blocked: true, reason: `Cylinder ${c.serial} is past its periodic test date (${c.nextTestDate}); it cannot be filled until it is retested.` }
  }
  const out = OUT_OF_USE[c.status as string]
  if (out) return { blocked: true, reason: `Cylinder ${c.serial} cannot be used: ${out}.` }
  return { blocked: false, reason: null }
}

/**
 * Throws 422 with the reason when the cylinder may not be used on `onDate` (periodic test overdue, held back,
 * retired). Used when a cylinder is planned or booked for a run; exported for the plans module.
 */
export function assertCylinderUsable(c: Pick<Cylinder, 'serial' | 'nextTestDate' | 'status'>, onDate: string = localIsoDate()): void {
  const today = localIsoDate()
  const block = cylinderBlock(c, onDate > today ? onDate : today)
  if (block.blocked)
    throw new UnprocessableError(block.reason ?? 'This cylinder cannot be used.', [
      { field: 'cylinderId', message: block.reason ?? 'blocked', code: 'cylinder_blocked' },
    ])
}

export function toCylinderDto(c: Cylinder, today: string = localIsoDate()): CylinderDto {
  const owner = c.owner as unknown as { id: number; company?: string } | null
  const block = cylinderBlock(c, today)
  return {
    id: c.id,
    serial: c.serial,
    barcode: c.barcode,
    waterVolumeL: c.waterVolumeL,
    servicePressureBar: c.servicePressureBar,
    testPressureBar: c.testPressureBar,
    material: c.material,
    valveOutlet: c.valveOutlet,
    oxygenClean: c.oxygenClean,
    ownerId: owner?.id ?? null,
    ownerName: owner?.company ?? null,
    lastTestDate: c.lastTestDate,
    nextTestDate: c.nextTestDate,
    testState: testStateOn(c.nextTestDate, today),
    status: c.status,
    residual: (c.residual ?? { kind: 'evacuated' }) as CylinderDto['residual'],
    notes: c.notes,
    blocked: block.blocked,
    blockReason: block.reason,
    version: c.version,
    updatedAt: new Date(c.updatedAt).toISOString(),
  }
}

function escapeLike(s: string): string {
  return s.replace(/[\\%_]/g, (m) => `\\${m}`)
}

export async function listCylinders(em: EntityManager, rawQuery: CylinderListQuery): Promise<CylinderList> {
  const query = CylinderListQuerySchema.parse(rawQuery)
  const today = localIsoDate()
  const where: FilterQuery<Cylinder> & Record<string, unknown> = {}
  if (query.status) where.status = query.status
  if (query.material) where.material = query.material
  if (query.oxygenClean) where.oxygenClean = query.oxygenClean === 'true'
  if (query.ownerId) where.owner = query.ownerId
  if (query.test === 'overdue') where.nextTestDate = { $lt: today }
  if (query.test === 'due-soon') where.nextTestDate = { $lte: addDaysIso(today, TEST_DUE_SOON_DAYS) }
  if (query.q) {
    // case-insensitive on both databases: SQLite's LIKE already is (for ASCII), PostgreSQL needs ILIKE
    const op = em.getPlatform().constructor.name.toLowerCase().includes('postgre') ? '$ilike' : '$like'
    const like = { [op]: `%${escapeLike(query.q)}%` }
    where.$or = [{ serial: like }, { barcode: like }, { valveOutlet: like }, { owner: { company: like } }, { owner: { code: like } }]
  }
  const [items, total] = await em.findAndCount(CylinderSchema, where as FilterQuery<Cylinder>, {
    populate: ['owner'],
    orderBy: { [query.sort]: query.dir, id: 'asc' },
    limit: query.limit,
    offset: query.offset,
  })
  return { items: items.map((c) => toCylinderDto(c, today)), total }
}

export async function findCylinderOr404(em: EntityManager, id: number): Promise<Cylinder> {
  const c = await em.findOne(CylinderSchema, { id }, { populate: ['owner'] })
  if (!c) throw new NotFoundError(`No cylinder ${id}.`)
  return c
}

export async function getCylinder(em: EntityManager, id: number): Promise<CylinderDto> {
  return toCylinderDto(await findCylinderOr404(em, id))
}

/** The cylinder whose barcode (or serial) was scanned. */
export async function findCylinderByCode(em: EntityManager, code: string): Promise<Cylinder | null> {
  const trimmed = code.trim()
  if (!trimmed) return null
  return em.findOne(CylinderSchema, { $or: [{ barcode: trimmed }, { serial: trimmed }] }, { populate: ['owner'] })
}

async function ownerRef(em: EntityManager, ownerId: number | null) {
  if (ownerId === null) return null
  const owner = await em.findOne(CustomerSchema, { id: ownerId })
  if (!owner)
    throw new UnprocessableError(`No customer ${ownerId} to own this cylinder.`, [
      { field: 'ownerId', message: 'Pick an existing customer, or none for shop-owned.' },
    ])
  return owner
}

async function assertUnique(em: EntityManager, serial: string, barcode: string, exceptId?: number): Promise<void> {
  const clash = await em.find(CylinderSchema, { $or: [{ serial }, { barcode }], ...(exceptId ? { id: { $ne: exceptId } } : {}) })
  const errors = []
  if (clash.some((c) => c.serial === serial)) errors.push({ field: 'serial', message: `Another cylinder already has serial ${serial}.` })
  if (clash.some((c) => c.barcode === barcode)) errors.push({ field: 'barcode', message: `Another cylinder already has barcode ${barcode}.` })
  // 409 naming the clashing fields, so the form can show them
  if (errors.length) throw new ConflictError(errors.map((e) => e.message).join(' '), { errors })
}

export async function createCylinder(em: EntityManager, user: SessionUser, input: CylinderInputParsed): Promise<CylinderDto> {
  return em.transactional(async (tx) => {
    await assertUnique(tx, input.serial, input.barcode)
    const owner = await ownerRef(tx, input.ownerId)
    const c = tx.create(CylinderSchema, {
      serial: input.serial,
      barcode: input.barcode,
      waterVolumeL: input.waterVolumeL,
      servicePressureBar: input.servicePressureBar,
      testPressureBar: input.testPressureBar,
      material: input.material,
      valveOutlet: input.valveOutlet,
      oxygenClean: input.oxygenClean,
      owner,
      lastTestDate: input.lastTestDate,
      nextTestDate: input.nextTestDate,
      status: input.status,
      residual: input.residual,
      notes: input.notes,
    })
    await tx.flush()
    audit(tx, user, 'cylinder.create', 'Cylinder', c.id, { serial: c.serial })
    await tx.flush()
    return toCylinderDto(c)
  })
}

/** States that follow the work; a person cannot set them by hand, nor leave them by hand. */
const WORKFLOW_STATES: ReadonlySet<Cylinder['status']> = new Set(['reserved', 'filling', 'awaiting-analysis'])

export async function updateCylinder(em: EntityManager, user: SessionUser, id: number, input: CylinderUpdate): Promise<CylinderDto> {
  return em.transactional(async (tx) => {
    const c = await findCylinderOr404(tx, id)
    if (c.version !== input.expectedVersion) {
      throw new ConflictError(
        `Cylinder ${c.serial} was changed by someone else (version ${c.version}, you edited ${input.expectedVersion}). Reload and make your change again.`,
        {
          current: toCylinderDto(c),
        },
      )
    }
    await assertUnique(tx, input.serial, input.barcode, id)
    const owner = await ownerRef(tx, input.ownerId)
    if (input.status && input.status !== c.status && WORKFLOW_STATES.has(c.status)) {
      throw new ConflictError(`Cylinder ${c.serial} is ${c.status} in a fill; its state changes with the work, not by hand.`)
    }
    const before = { serial: c.serial, nextTestDate: c.nextTestDate, status: c.status }
    tx.assign(c, {
      serial: input.serial,
      barcode: input.barcode,
      waterVolumeL: input.waterVolumeL,
      servicePressureBar: input.servicePressureBar,
      testPressureBar: input.testPressureBar,
      material: input.material,
      valveOutlet: input.valveOutlet,
      oxygenClean: input.oxygenClean,
      owner,
      lastTestDate: input.lastTestDate,
      nextTestDate: input.nextTestDate,
      residual: input.residual,
      notes: input.notes,
      ...(input.status ? { status: input.status } : {}),
    })
    audit(tx, user, 'cylinder.update', 'Cylinder', c.id, { before, after: { serial: c.serial, nextTestDate: c.nextTestDate, status: c.status } })
    await tx.flush()
    return toCylinderDto(c)
  })
}

export async function ownerOptions(em: EntityManager): Promise<CylinderOwnerOption[]> {
  const customers = await em.find(CustomerSchema, {}, { orderBy: { company: 'asc' } })
  return customers.map((c) => ({ id: c.id, code: c.code, company: c.company }))
}

/** Every run the cylinder went through, newest first, with its readings. */
export async function cylinderHistory(em: EntityManager, id: number): Promise<CylinderHistory> {
  await findCylinderOr404(em, id)
  const runs = await em.find(
    FillRunSchema,
    { cylinder: id },
    { populate: ['plan', 'plan.orderLine', 'plan.orderLine.order'], orderBy: { createdAt: 'desc', id: 'desc' } },
  )
  const readings = runs.length ? await em.find(FillReadingSchema, { run: { $in: runs.map((r) => r.id) } }, { orderBy: { recordedAt: 'asc', id: 'asc' } }) : []
  const userIds = new Set<number>()
  for (const r of runs) if (r.technicianId) userIds.add(r.technicianId)
  for (const r of readings) userIds.add(r.recordedById)
  const users = userIds.size ? await em.find(UserSchema, { id: { $in: [...userIds] } }) : []
  const nameOf = (uid: number | null) => (uid === null ? null : (users.find((u) => u.id === uid)?.name ?? null))
  return {
    cylinderId: id,
    runs: runs.map((r) => {
      const plan = r.plan as unknown as { id: number; orderLine?: { description?: string; order?: { number?: string } } }
      return {
        runId: r.id,
        planId: plan.id,
        orderNumber: plan.orderLine?.order?.number ?? null,
        description: plan.orderLine?.description ?? null,
        status: r.status,
        scheduledFor: r.scheduledFor,
        startedAt: r.startedAt ? new Date(r.startedAt).toISOString() : null,
        completedAt: r.completedAt ? new Date(r.completedAt).toISOString() : null,
        technician: nameOf(r.technicianId ?? null),
        replanCount: r.replanCount,
        readings: readings
          .filter((x) => (x.run as unknown as { id: number }).id === r.id)
          .map((x) => ({
            id: x.id,
            stepIndex: x.stepIndex,
            gas: x.gas,
            pressureBarGauge: x.pressureBarGauge ?? null,
            pressureBarAbs: x.pressureBarAbs ?? null,
            temperatureC: x.temperatureC ?? null,
            scaleKg: x.scaleKg ?? null,
            outcome: x.outcome,
            recordedBy: nameOf(x.recordedById),
            recordedAt: new Date(x.recordedAt).toISOString(),
          })),
      }
    }),
  }
}
