import type { EntityManager } from '@mikro-orm/core'
import { getGas, isKnownGas } from '#shared/physics/index.ts'
import type { SessionUser } from '#shared/schemas/auth.ts'
import {
  type AnalysisInput,
  AnalysisInputSchema,
  type Analysis as AnalysisDto,
  type AnalysisVerdict,
  type CertificateContent,
  type CertificateDetail,
  type CertificateListQuery,
  type CertificateSummary,
  type CertifiedComponent,
  type Comparison,
  type ComparisonRow,
  type CorrectionInput,
  CorrectionInputSchema,
  type CompositionUnit,
  formatWithUncertainty,
  type Hazard,
  naturalUnit,
  type QaQueue,
  type QaQueueItem,
  type QaRunDetail,
  type RejectInput,
  type ReleaseDefaults,
  type ReleaseInput,
  type ReleaseResult,
  toMoleFraction,
} from '#shared/schemas/quality.ts'
import { audit } from '../../lib/audit.ts'
import type { AppDeps } from '../../lib/deps.ts'
import { ConflictError, HttpError, NotFoundError, UnprocessableError } from '../../lib/http-errors.ts'
import { verifyPassword } from '../../lib/passwords.ts'
import { DEMO_SHOP } from '../../seed/demo.ts'
import { type Order, type OrderLine, OrderLineSchema } from '../orders/order.entity.ts'
import { transitionOrder } from '../orders/orders.service.ts'
import { type FillRun, FillRunSchema } from '../runs/fill-run.entity.ts'
import { UserSchema } from '../users/user.entity.ts'
import { renderCertificatePdf } from './certificate-pdf.ts'
import { gasLabel, hazardFor } from './hazard.ts'
import { type Analysis, type AnalysisResult, AnalysisSchema, type Certificate, CertificateSchema } from './quality.entity.ts'
import { type CheckedReport, readReport, removeReport, storeReport } from './report-upload.ts'

const STAFF_CERTIFICATE_ROLES = ['admin', 'qa', 'sales', 'blender'] as const
const CERTIFICATE_TITLE = 'Certificate of composition — calibration gas mixture'
/** settled fill pressures are stated at 15 °C (the order line's reference temperature) */
const REFERENCE_TEMPERATURE_C = 15
/** relative slack on the tolerance comparisons, so a value exactly on the limit counts as within */
const EPS = 1e-9

const iso = (d: Date | null | undefined): string | null => (d ? new Date(d).toISOString() : null)
const isoDate = (d: Date): string => d.toISOString().slice(0, 10)

/** yyyy-mm-dd plus whole months, the day clamped to the target month's length */
export function addMonths(date: string, months: number): string {
  const [y, m, d] = date.split('-').map(Number)
  const total = y * 12 + (m - 1) + months
  const year = Math.floor(total / 12)
  const month = total % 12
  const last = new Date(Date.UTC(year, month + 1, 0)).getUTCDate()
  return `${year}-${String(month + 1).padStart(2, '0')}-${String(Math.min(d, last)).padStart(2, '0')}`
}

function isStaff(user: SessionUser): boolean {
  return user.roles.some((r) => (STAFF_CERTIFICATE_ROLES as readonly string[]).includes(r))
}

// ---- loading -------------------------------------------------------------------------------------------

type RunWithContext = FillRun & { plan: FillRun['plan'] & { orderLine: OrderLine & { order: Order } } }

async function loadRun(em: EntityManager, runId: number): Promise<RunWithContext> {
  const run = await em.findOne(FillRunSchema, runId, {
    populate: ['cylinder', 'plan', 'plan.orderLine', 'plan.orderLine.order', 'plan.orderLine.order.customer'],
  })
  if (!run) throw new NotFoundError('No fill run with this id.')
  return run as RunWithContext
}

function lineOf(run: RunWithContext): OrderLine & { order: Order } {
  return run.plan.orderLine
}

/** the non-balance components of an order line: what QA certifies */
function certifiedSpec(line: OrderLine): { gas: string; fraction: number }[] {
  return line.components.filter((c) => c.gas !== line.balanceGas && c.fraction > 0)
}

function specUnit(line: OrderLine, gas: string, fraction: number): CompositionUnit {
  const c = line.components.find((x) => x.gas === gas) as { unit?: CompositionUnit } | undefined
  return c?.unit && ['percent', 'ppm', 'mol/mol'].includes(c.unit) ? c.unit : naturalUnit(fraction)
}

// ---- comparison with the specification ---------------------------------------------------------------------

function pct(n: number): string {
  return `${n >= 0 ? '+' : '−'}${Math.abs(n * 100).toFixed(2)} %`
}

/** Analysis against the order line: deviation from target within the blend tolerance, uncertainty within the asked one. */
export function compareWithSpec(line: OrderLine, results: readonly AnalysisResult[]): Comparison {
  const rows: ComparisonRow[] = certifiedSpec(line).map((spec) => {
    const label = gasLabel(spec.gas)
    const r = results.find((x) => x.gas === spec.gas)
    const unit = r?.unit ?? specUnit(line, spec.gas, spec.fraction)
    const base = {
      ...label,
      targetFraction: spec.fraction,
      unit,
      tolerancePct: line.blendTolerancePct,
      uncertaintyLimitPct: line.certificationUncertaintyPct,
    }
    if (!r) {
      return {
        ...base,
        measuredFraction: null,
        expandedUncertainty: null,
        coverageFactor: null,
        deviationRelative: null,
        withinTolerance: null,
        uncertaintyRelativePct: null,
        uncertaintyWithinSpec: null,
        state: 'blocked' as const,
        message: 'Not entered yet.',
        instrument: null,
        method: null,
      }
    }
    const deviationRelative = (r.value - spec.fraction) / spec.fraction
    const withinTolerance = Math.abs(deviationRelative) <= line.blendTolerancePct / 100 + EPS
    const uncertaintyRelativePct = (r.expandedUncertainty / r.value) * 100
    const uncertaintyWithinSpec = uncertaintyRelativePct <= line.certificationUncertaintyPct * (1 + EPS)
    const problems: string[] = []
    if (!withinTolerance) problems.push(`Deviation ${pct(deviationRelative)} is outside the ±${line.blendTolerancePct} % blend tolerance.`)
    if (!uncertaintyWithinSpec)
      problems.push(
        `Expanded uncertainty ${uncertaintyRelativePct.toFixed(2)} % (relative) is larger than the ${line.certificationUncertaintyPct} % asked for.`,
      )
    return {
      ...base,
      measuredFraction: r.value,
      expandedUncertainty: r.expandedUncertainty,
      coverageFactor: r.coverageFactor,
      deviationRelative,
      withinTolerance,
      uncertaintyRelativePct,
      uncertaintyWithinSpec,
      state: problems.length ? ('blocked' as const) : ('clear' as const),
      message: problems.length ? problems.join(' ') : `Deviation ${pct(deviationRelative)}, within ±${line.blendTolerancePct} %.`,
      instrument: r.instrument,
      method: r.method,
    }
  })
  const blockers = rows.filter((r) => r.state === 'blocked').map((r) => `${r.formula}: ${r.message}`)
  return { rows, balanceGas: gasLabel(line.balanceGas), releasable: rows.length > 0 && blockers.length === 0, blockers }
}

function verdictOf(c: Comparison): AnalysisVerdict {
  if (c.releasable) return 'within-tolerance'
  return c.rows.some((r) => r.measuredFraction === null) ? 'pending' : 'out-of-tolerance'
}

/** Converts entered values to mole fractions and checks every gas belongs to the specification (422 otherwise). */
function toResults(line: OrderLine, input: AnalysisInput, field = 'results'): AnalysisResult[] {
  const parsed = AnalysisInputSchema.parse(input)
  const spec = new Set(certifiedSpec(line).map((c) => c.gas))
  const errors = parsed.results.flatMap((r, i) =>
    r.gas === line.balanceGas
      ? [{ field: `${field}.${i}.gas`, message: `${gasLabel(r.gas).formula} is the balance gas (the remainder); it is not entered` }]
      : spec.has(r.gas)
        ? []
        : [{ field: `${field}.${i}.gas`, message: `${gasLabel(r.gas).formula} is not a component of this specification` }],
  )
  if (errors.length) throw new UnprocessableError('Some analysed gases are not in the specification.', errors)
  const sum = parsed.results.reduce((s, r) => s + toMoleFraction(r.value, r.unit), 0)
  if (sum >= 1) throw new UnprocessableError('The certified components add up to 100 % or more; check the units.', [{ field, message: 'sum ≥ 100 %' }])
  return parsed.results.map((r) => ({
    gas: r.gas,
    value: toMoleFraction(r.value, r.unit),
    expandedUncertainty: toMoleFraction(r.expandedUncertainty, r.unit),
    coverageFactor: r.coverageFactor,
    instrument: r.instrument,
    method: r.method,
    unit: r.unit,
  }))
}

// ---- DTOs ----------------------------------------------------------------------------------------------

async function analysisDto(em: EntityManager, a: Analysis): Promise<AnalysisDto> {
  const by = a.analysedById ? await em.findOne(UserSchema, a.analysedById, { fields: ['name'] }) : null
  return {
    id: a.id,
    runId: (a.run as FillRun).id,
    verdict: a.verdict,
    results: a.results.map((r) => ({ ...r, unit: r.unit ?? naturalUnit(r.value) })),
    rejectReason: a.rejectReason ?? null,
    report: a.reportStoredName
      ? { originalName: a.reportOriginalName ?? 'report', contentType: a.reportContentType ?? 'application/octet-stream', sizeBytes: a.reportSizeBytes ?? 0 }
      : null,
    analysedByName: by?.name ?? null,
    analysedAt: iso(a.analysedAt),
    version: a.version,
  }
}

type CertWithContext = Certificate & { orderLine: OrderLine & { order: Order & { customer: { company: string } } }; cylinder: { serial: string } }

const CERT_POPULATE = ['orderLine', 'orderLine.order', 'orderLine.order.customer', 'cylinder'] as const

/** Summaries with supersession worked out from every revision of the numbers involved. */
async function summarise(em: EntityManager, certs: Certificate[]): Promise<CertificateSummary[]> {
  if (!certs.length) return []
  const numbers = [...new Set(certs.map((c) => c.number))]
  const all = await em.find(CertificateSchema, { number: { $in: numbers } }, { fields: ['id', 'number', 'revision', 'replacesId'] })
  const replacedBy = new Map<number, { id: number; revision: number }>()
  for (const c of all) if (c.replacesId) replacedBy.set(c.replacesId, { id: c.id, revision: c.revision })
  return (certs as CertWithContext[]).map((c) => {
    const next = replacedBy.get(c.id) ?? null
    return {
      id: c.id,
      number: c.number,
      revision: c.revision,
      replacesId: c.replacesId ?? null,
      current: next === null,
      supersededById: next?.id ?? null,
      supersededByRevision: next?.revision ?? null,
      orderId: c.orderLine.order.id,
      orderNumber: c.orderLine.order.number,
      customerId: c.customerId,
      customerCompany: c.orderLine.order.customer.company,
      cylinderSerial: c.cylinder.serial,
      description: c.orderLine.description,
      releasedAt: iso(c.releasedAt) as string,
      validUntil: c.validUntil,
      signatoryName: c.signatoryName,
      correctionReason: c.correctionReason ?? null,
    }
  })
}

// ---- queue ---------------------------------------------------------------------------------------------

const QUEUE_LIMIT = 200

/** Completed fill runs without a released certificate, split into "awaiting analysis" and "ready to release". */
export async function qaQueue(em: EntityManager): Promise<QaQueue> {
  // completed runs of orders not cancelled, with no closed (released or rejected) analysis, oldest first
  const open: { id: number | string }[] = await em
    .getConnection()
    .execute(
      'select r.id from fill_runs r where r.status = ? and not exists ' +
        "(select 1 from analyses a where a.run_id = r.id and a.verdict in ('released', 'rejected')) " +
        'and not exists (select 1 from fill_plans p join order_lines l on l.id = p.order_line_id join orders o on o.id = l.order_id ' +
        "where p.id = r.plan_id and o.status = 'cancelled') " +
        'order by r.completed_at asc, r.id asc limit ?',
      ['completed', QUEUE_LIMIT],
    )
  const ids = open.map((row) => Number(row.id))
  const runs = ids.length
    ? await em.find(
        FillRunSchema,
        { id: { $in: ids } },
        {
          populate: ['cylinder', 'plan', 'plan.orderLine', 'plan.orderLine.order', 'plan.orderLine.order.customer'],
          orderBy: { completedAt: 'asc', id: 'asc' },
        },
      )
    : []
  const analyses = runs.length ? await em.find(AnalysisSchema, { run: { $in: runs.map((r) => r.id) } }) : []
  const byRun = new Map(analyses.map((a) => [(a.run as FillRun).id, a]))
  const items: QaQueueItem[] = (runs as RunWithContext[]).map((run) => {
    const a = byRun.get(run.id)
    const line = lineOf(run)
    return {
      runId: run.id,
      analysisId: a?.id ?? null,
      verdict: a?.verdict ?? null,
      cylinder: { id: run.cylinder.id, serial: run.cylinder.serial, waterVolumeL: run.cylinder.waterVolumeL },
      order: { id: line.order.id, number: line.order.number, customer: (line.order.customer as { company: string }).company },
      line: { id: line.id, lineNo: line.lineNo, description: line.description },
      completedAt: iso(run.completedAt),
      reportAttached: Boolean(a?.reportStoredName),
    }
  })
  return {
    awaitingAnalysis: items.filter((i) => i.verdict !== 'within-tolerance'),
    readyToRelease: items.filter((i) => i.verdict === 'within-tolerance'),
  }
}

// ---- workspace -----------------------------------------------------------------------------------------

function planResult(run: RunWithContext): Record<string, unknown> {
  const r = run.plan.result as Record<string, unknown> | null
  const premix = r?.premixProposal as { productPlan?: Record<string, unknown> } | undefined
  return premix?.productPlan ?? r ?? {}
}

function toCelsius(t: unknown): number | null {
  if (!t || typeof t !== 'object') return null
  const { value, unit } = t as { value?: unknown; unit?: unknown }
  if (typeof value !== 'number' || !Number.isFinite(value)) return null
  if (unit === 'K') return value - 273.15
  if (unit === 'C') return value
  if (unit === 'F') return ((value - 32) * 5) / 9
  return null
}

/**
 * Defaults the signer confirms or changes (common practice, no source): validity 12 months with a toxic or
 * corrosive component, else 36; do not use below 7 bar gauge; store below 50 °C; the lower temperature is the
 * plan's condensation-free minimum when the plan states one, else −20 °C.
 */
export function releaseDefaults(run: RunWithContext): ReleaseDefaults {
  const line = lineOf(run)
  const reactive = certifiedSpec(line).some((c) => hazardFlags(c.gas).some((f) => f === 'toxic' || f === 'corrosive'))
  const minC = toCelsius(planResult(run).minimumSafeTemperature)
  return {
    validityMonths: reactive ? 12 : 36,
    minimumUsePressureBarGauge: 7,
    // the certificate states storage limits within -60..60 °C (the release schema's range)
    storageMinC: minC === null ? -20 : Math.min(60, Math.max(-60, Math.ceil(minC))),
    storageMaxC: 50,
    storageMinSource:
      minC === null ? 'No condensable component in the plan: −20 °C (shop practice).' : 'Lowest condensation-free temperature from the approved fill plan.',
  }
}

function hazardFlags(gas: string): string[] {
  return isKnownGas(gas) ? [...getGas(gas).hazards] : []
}

function hazardOfLine(line: OrderLine, results: readonly AnalysisResult[]): Hazard {
  const certified = certifiedSpec(line).map((c) => ({ gas: c.gas, fraction: results.find((r) => r.gas === c.gas)?.value ?? c.fraction }))
  const minor = certified.reduce((s, c) => s + c.fraction, 0)
  return hazardFor([...certified, { gas: line.balanceGas, fraction: Math.max(0, 1 - minor) }], line.finalPressureBarGauge)
}

export async function runDetail(em: EntityManager, runId: number): Promise<QaRunDetail> {
  const run = await loadRun(em, runId)
  const line = lineOf(run)
  const analysis = await em.findOne(AnalysisSchema, { run: runId })
  const results = analysis?.results ?? []
  const certs = analysis ? await em.find(CertificateSchema, { analysis: analysis.id }, { populate: CERT_POPULATE, orderBy: { revision: 'asc' } }) : []
  return {
    run: { id: run.id, status: run.status, startedAt: iso(run.startedAt), completedAt: iso(run.completedAt) },
    cylinder: {
      id: run.cylinder.id,
      serial: run.cylinder.serial,
      waterVolumeL: run.cylinder.waterVolumeL,
      material: run.cylinder.material,
      valveOutlet: run.cylinder.valveOutlet,
      servicePressureBar: run.cylinder.servicePressureBar,
      status: run.cylinder.status,
    },
    order: {
      id: line.order.id,
      number: line.order.number,
      status: line.order.status,
      customer: (line.order.customer as { company: string }).company,
      reference: line.order.reference,
    },
    line: {
      id: line.id,
      lineNo: line.lineNo,
      description: line.description,
      method: line.method,
      blendTolerancePct: line.blendTolerancePct,
      certificationUncertaintyPct: line.certificationUncertaintyPct,
      finalPressureBarGauge: line.finalPressureBarGauge,
      components: line.components.map((c) => ({ ...gasLabel(c.gas), fraction: c.fraction, balance: c.gas === line.balanceGas })),
    },
    analysis: analysis ? await analysisDto(em, analysis) : null,
    comparison: compareWithSpec(line, results),
    hazard: hazardOfLine(line, results),
    releaseDefaults: releaseDefaults(run),
    certificates: await summarise(em, certs),
  }
}

// ---- analysis entry, report, rejection --------------------------------------------------------------------

function assertAnalysable(run: RunWithContext): void {
  if (run.status !== 'completed') throw new ConflictError(`This cylinder's fill run is ${run.status}, not completed: it cannot be analysed yet.`)
}

function assertOpen(a: Analysis | null): void {
  if (a?.verdict === 'released') throw new ConflictError('The certificate is released; change it with a correction (a new revision).')
  if (a?.verdict === 'rejected') throw new ConflictError('This analysis was sent back for rework and is closed; the refilled cylinder gets a new run.')
}

export async function saveAnalysis(em: EntityManager, user: SessionUser, runId: number, input: AnalysisInput): Promise<QaRunDetail> {
  await em.transactional(async (tx) => {
    const run = await loadRun(tx, runId)
    assertAnalysable(run)
    const line = lineOf(run)
    const results = toResults(line, input)
    let analysis = await tx.findOne(AnalysisSchema, { run: runId })
    assertOpen(analysis)
    const verdict = verdictOf(compareWithSpec(line, results))
    if (!analysis) analysis = tx.create(AnalysisSchema, { run, results, verdict, analysedById: user.id, analysedAt: new Date() })
    else tx.assign(analysis, { results, verdict, analysedById: user.id, analysedAt: new Date() })
    await tx.flush()
    audit(tx, user, 'analysis.saved', 'Analysis', analysis.id, { runId, verdict, results })
  })
  return runDetail(em, runId)
}

export async function attachReport(em: EntityManager, deps: AppDeps, user: SessionUser, runId: number, report: CheckedReport): Promise<QaRunDetail> {
  const run = await loadRun(em, runId)
  assertAnalysable(run)
  assertOpen(await em.findOne(AnalysisSchema, { run: runId }))
  const stored = await storeReport(deps.uploadDir, report)
  let previous: string | null = null
  try {
    await em.transactional(async (tx) => {
      let analysis = await tx.findOne(AnalysisSchema, { run: runId })
      assertOpen(analysis)
      if (!analysis) analysis = tx.create(AnalysisSchema, { run: runId, results: [], verdict: 'pending' })
      previous = analysis.reportStoredName ?? null
      tx.assign(analysis, {
        reportStoredName: stored,
        reportOriginalName: report.originalName,
        reportContentType: report.contentType,
        reportSizeBytes: report.buffer.length,
      })
      await tx.flush()
      audit(tx, user, 'analysis.report-attached', 'Analysis', analysis.id, { runId, originalName: report.originalName, sizeBytes: report.buffer.length })
    })
  } catch (err) {
    await removeReport(deps.uploadDir, stored)
    throw err
  }
  if (previous) await removeReport(deps.uploadDir, previous).catch(() => undefined)
  return runDetail(em, runId)
}

export async function reportFile(em: EntityManager, deps: AppDeps, runId: number): Promise<{ bytes: Buffer; name: string; contentType: string }> {
  const analysis = await em.findOne(AnalysisSchema, { run: runId })
  if (!analysis?.reportStoredName) throw new NotFoundError('No report uploaded for this cylinder.')
  return {
    bytes: await readReport(deps.uploadDir, analysis.reportStoredName),
    name: analysis.reportOriginalName ?? 'report',
    contentType: analysis.reportContentType ?? 'application/octet-stream',
  }
}

/** Sends the cylinder back for rework: the analysis closes with the reason, the cylinder is held in quarantine. */
export async function rejectAnalysis(em: EntityManager, user: SessionUser, runId: number, input: RejectInput): Promise<QaRunDetail> {
  await em.transactional(async (tx) => {
    const run = await loadRun(tx, runId)
    assertAnalysable(run)
    let analysis = await tx.findOne(AnalysisSchema, { run: runId })
    assertOpen(analysis)
    if (!analysis)
      analysis = tx.create(AnalysisSchema, { run, results: [], verdict: 'rejected', rejectReason: input.reason, analysedById: user.id, analysedAt: new Date() })
    else tx.assign(analysis, { verdict: 'rejected', rejectReason: input.reason, analysedById: user.id, analysedAt: new Date() })
    const cylinder = run.cylinder
    const note = `QA sent back for rework on ${isoDate(new Date())} (run ${run.id}): ${input.reason}`
    tx.assign(cylinder, { status: 'quarantine', notes: cylinder.notes ? `${cylinder.notes}\n${note}` : note })
    await tx.flush()
    audit(tx, user, 'analysis.rejected', 'Analysis', analysis.id, { runId, cylinderId: cylinder.id, reason: input.reason })
  })
  return runDetail(em, runId)
}

// ---- certificate content -----------------------------------------------------------------------------------

const PREPARATION = {
  gravimetric: { label: 'Gravimetric', reference: 'ISO 6142-1' },
  'partial-pressure': { label: 'Partial pressure (manometric)', reference: 'ISO 6146' },
} as const

function traceability(method: OrderLine['method']): string {
  const analysis =
    'The certified values are the results of analysis by comparison with reference gas mixtures whose compositions are ' +
    'metrologically traceable to the SI through national measurement standards; the calibration records of the reference ' +
    `mixtures and instruments are kept by ${DEMO_SHOP.name} and are available on request.`
  return method === 'gravimetric'
    ? `${analysis} The gravimetric preparation (masses traceable to the SI through calibrated weights, ISO 6142-1) was verified against the analysis.`
    : `${analysis} The partial-pressure preparation values were used only to check the analysis.`
}

function certifiedComponents(results: readonly AnalysisResult[], line: OrderLine): CertifiedComponent[] {
  return certifiedSpec(line).map((spec) => {
    const r = results.find((x) => x.gas === spec.gas)
    if (!r) throw new UnprocessableError(`${gasLabel(spec.gas).formula} has no analysed value.`)
    const unit = r.unit ?? naturalUnit(r.value)
    const text = formatWithUncertainty(r.value, r.expandedUncertainty, unit)
    return {
      ...gasLabel(r.gas),
      fraction: r.value,
      expandedUncertainty: r.expandedUncertainty,
      coverageFactor: r.coverageFactor,
      unit,
      valueText: text.value,
      uncertaintyText: text.uncertainty,
      instrument: r.instrument,
      method: r.method,
    }
  })
}

interface ContentArgs {
  run: RunWithContext
  results: readonly AnalysisResult[]
  analysedAt: Date | null
  number: string
  revision: number
  conditions: Omit<ReleaseInput, 'password'>
  signer: SessionUser
  certifiedOn: string
  issuedOn: string
  correction: CertificateContent['correction']
}

function buildContent(a: ContentArgs): CertificateContent {
  const line = lineOf(a.run)
  const order = line.order
  const customer = order.customer as { company: string; contactName: string; billingAddress: string }
  const cyl = a.run.cylinder
  const composition = certifiedComponents(a.results, line)
  return {
    title: CERTIFICATE_TITLE,
    number: a.number,
    revision: a.revision,
    producer: { name: DEMO_SHOP.name, address: DEMO_SHOP.address, phone: DEMO_SHOP.phone, email: DEMO_SHOP.email },
    customer: { company: customer.company, contactName: customer.contactName, address: customer.billingAddress.replace(/\n/g, ', ') },
    order: { number: order.number, reference: order.reference, lineNo: line.lineNo, description: line.description },
    cylinder: {
      serial: cyl.serial,
      barcode: cyl.barcode,
      waterVolumeL: cyl.waterVolumeL,
      material: cyl.material,
      valveOutlet: cyl.valveOutlet,
      servicePressureBar: cyl.servicePressureBar,
      nextTestDate: cyl.nextTestDate,
    },
    filling: {
      pressureBarGauge: line.finalPressureBarGauge,
      referenceTemperatureC: REFERENCE_TEMPERATURE_C,
      minimumUsePressureBarGauge: a.conditions.minimumUsePressureBarGauge,
      storageMinC: a.conditions.storageMinC,
      storageMaxC: a.conditions.storageMaxC,
    },
    composition,
    balanceGas: gasLabel(line.balanceGas),
    preparation: { method: line.method, ...PREPARATION[line.method as keyof typeof PREPARATION] },
    analysis: {
      methods: [...new Set(composition.map((c) => c.method))],
      instruments: [...new Set(composition.map((c) => c.instrument))],
      reference: 'Comparison with reference gas mixtures (ISO 6143 or ISO 12963, as stated per component)',
    },
    traceability: traceability(line.method),
    dates: {
      preparedOn: isoDate(a.run.completedAt ?? a.run.updatedAt),
      analysedOn: isoDate(a.analysedAt ?? new Date()),
      certifiedOn: a.certifiedOn,
      issuedOn: a.issuedOn,
      validUntil: addMonths(a.certifiedOn, a.conditions.validityMonths),
    },
    signatory: { name: a.signer.name, email: a.signer.email, capacity: 'Quality assurance, authorised signatory' },
    hazard: hazardOfLine(line, a.results),
    correction: a.correction,
  }
}

async function nextCertificateNumber(em: EntityManager, on: Date): Promise<string> {
  const prefix = `FWC-${on.getUTCFullYear()}-`
  const count = await em.count(CertificateSchema, { revision: 1, number: { $like: `${prefix}%` } })
  return `${prefix}${String(count + 1).padStart(5, '0')}`
}

/** Wrong signature passwords allowed per signer in the window before 429 (per app process; common practice, no source). */
const SIGNATURE_MAX_FAILURES = 5
const SIGNATURE_WINDOW_MS = 15 * 60_000
/** failures per signer, per app (keyed by the app's deps, so separate apps in one process do not share counts) */
const signatureFailuresByApp = new WeakMap<AppDeps, Map<number, number[]>>()

/** The signature: the signer's own password, checked against the stored hash (403 when wrong, nothing written). */
async function confirmSignature(em: EntityManager, deps: AppDeps, user: SessionUser, password: string): Promise<void> {
  let signatureFailures = signatureFailuresByApp.get(deps)
  if (!signatureFailures) {
    signatureFailures = new Map()
    signatureFailuresByApp.set(deps, signatureFailures)
  }
  const now = Date.now()
  const recent = (signatureFailures.get(user.id) ?? []).filter((t) => now - t < SIGNATURE_WINDOW_MS)
  if (recent.length >= SIGNATURE_MAX_FAILURES) {
    throw new HttpError(429, 'Too many attempts', 'Too many wrong signature passwords. Wait 15 minutes, or ask an administrator. Nothing was changed.')
  }
  const row = await em.findOne(UserSchema, user.id, { populate: ['passwordHash'] })
  if (!row?.active || !(await verifyPassword(row.passwordHash, password))) {
    signatureFailures.set(user.id, [...recent, now])
    throw new HttpError(403, 'Signature not confirmed', 'The password is not right. Nothing was released or changed.', [
      { field: 'password', message: 'not your password' },
    ])
  }
  signatureFailures.delete(user.id)
}

/** An order is certified when every line has as many certified cylinders as it asks for. */
async function orderFullyCertified(em: EntityManager, orderId: number): Promise<boolean> {
  const lines = await em.find(OrderLineSchema, { order: orderId })
  if (!lines.length) return false
  const certs = await em.find(CertificateSchema, { orderLine: { $in: lines.map((l) => l.id) }, revision: 1 }, { fields: ['orderLine', 'cylinder'] })
  return lines.every(
    (l) => new Set(certs.filter((c) => (c.orderLine as OrderLine).id === l.id).map((c) => (c.cylinder as { id: number }).id)).size >= l.quantity,
  )
}

async function mailCertificate(deps: AppDeps, to: string, content: CertificateContent, pdf: Buffer, log: (err: unknown) => void): Promise<boolean> {
  const corrected = content.correction
  const subject = corrected
    ? `Corrected certificate ${content.number} rev. ${content.revision} — cylinder ${content.cylinder.serial}`
    : `Certificate ${content.number} — cylinder ${content.cylinder.serial}, order ${content.order.number}`
  const text = [
    `Dear ${content.customer.contactName},`,
    '',
    corrected
      ? `attached is revision ${content.revision} of certificate ${content.number}. It replaces revision ${corrected.replacesRevision}: ${corrected.reason}`
      : `attached is the certificate of composition ${content.number} for cylinder ${content.cylinder.serial} (order ${content.order.number}, line ${content.order.lineNo}).`,
    `The certified values are valid until ${content.dates.validUntil}. You can also download every revision from your Fillwright documents.`,
    '',
    content.hazard.statement,
    '',
    `${content.signatory.name}`,
    DEMO_SHOP.name,
  ].join('\n')
  try {
    await deps.mailer.send({
      to,
      subject,
      text,
      attachments: [{ filename: `${content.number}-rev${content.revision}.pdf`, content: pdf, contentType: 'application/pdf' }],
    })
    return true
  } catch (err) {
    log(err)
    return false
  }
}

// ---- release and correction -------------------------------------------------------------------------------

export async function releaseCertificate(
  em: EntityManager,
  deps: AppDeps,
  user: SessionUser,
  runId: number,
  input: ReleaseInput,
  log: (err: unknown) => void,
): Promise<ReleaseResult> {
  // cheap checks first, then the signature, then the one transaction that writes
  const run0 = await loadRun(em, runId)
  assertAnalysable(run0)
  const a0 = await em.findOne(AnalysisSchema, { run: runId })
  if (!a0) throw new ConflictError('Enter the analysis before releasing.')
  assertOpen(a0)
  await confirmSignature(em, deps, user, input.password)

  const { password: _password, ...conditions } = input
  let content!: CertificateContent
  let pdf!: Buffer
  let certificateId = 0
  let orderReleased = false
  let contactEmail = ''
  await em.transactional(async (tx) => {
    const run = await loadRun(tx, runId)
    const line = lineOf(run)
    const analysis = await tx.findOneOrFail(AnalysisSchema, { run: runId })
    assertOpen(analysis)
    const comparison = compareWithSpec(line, analysis.results)
    if (!comparison.releasable) throw new UnprocessableError(`Not releasable: ${comparison.blockers.join(' ')}`)
    const now = new Date()
    const today = isoDate(now)
    const number = await nextCertificateNumber(tx, now)
    content = buildContent({
      run,
      results: analysis.results,
      analysedAt: analysis.analysedAt ?? null,
      number,
      revision: 1,
      conditions,
      signer: user,
      certifiedOn: today,
      issuedOn: today,
      correction: null,
    })
    pdf = await renderCertificatePdf(content)
    analysis.verdict = 'released'
    run.cylinder.status = 'full'
    const cert = tx.create(CertificateSchema, {
      number,
      revision: 1,
      replacesId: null,
      orderLine: line,
      cylinder: run.cylinder,
      analysis,
      customerId: line.order.customer.id,
      content: content as unknown as Record<string, unknown>,
      signatoryId: user.id,
      signatoryName: user.name,
      releasedAt: now,
      validUntil: content.dates.validUntil,
      correctionReason: null,
    })
    await tx.flush()
    certificateId = cert.id
    audit(tx, user, 'certificate.released', 'Certificate', cert.id, { number, revision: 1, runId, cylinder: run.cylinder.serial })
    contactEmail = (line.order.customer as { contactEmail: string }).contactEmail
    if (line.order.status === 'analysis' && (await orderFullyCertified(tx, line.order.id))) {
      await transitionOrder(tx, user, line.order.id, 'released')
      orderReleased = true
    }
    await tx.flush()
  })
  const emailed = await mailCertificate(deps, contactEmail, content, pdf, log)
  const cert = await em.findOneOrFail(CertificateSchema, certificateId, { populate: CERT_POPULATE })
  const [summary] = await summarise(em, [cert])
  return { certificate: summary, emailed, orderReleased }
}

/** A correction never edits a certificate: it issues revision N+1 naming revision N, with the reason. */
export async function correctCertificate(
  em: EntityManager,
  deps: AppDeps,
  user: SessionUser,
  certificateId: number,
  input: CorrectionInput,
  log: (err: unknown) => void,
): Promise<ReleaseResult> {
  const parsed = CorrectionInputSchema.parse(input)
  const old0 = await em.findOne(CertificateSchema, certificateId)
  if (!old0) throw new NotFoundError('No certificate with this id.')
  await confirmSignature(em, deps, user, parsed.password)

  let content!: CertificateContent
  let pdf!: Buffer
  let newId = 0
  let contactEmail = ''
  await em.transactional(async (tx) => {
    const old = await tx.findOneOrFail(CertificateSchema, certificateId, { populate: ['analysis'] })
    const newer = await tx.findOne(CertificateSchema, { replacesId: old.id })
    if (newer)
      throw new ConflictError(`Revision ${old.revision} is already superseded by revision ${newer.revision}; correct the current revision.`, {
        currentId: newer.id,
      })
    const analysis = old.analysis as Analysis
    const run = await loadRun(tx, (analysis.run as FillRun).id)
    const line = lineOf(run)
    const prev = old.content as unknown as CertificateContent
    let results: AnalysisResult[] = prev.composition.map((c) => ({
      gas: c.gas,
      value: c.fraction,
      expandedUncertainty: c.expandedUncertainty,
      coverageFactor: c.coverageFactor,
      instrument: c.instrument,
      method: c.method,
      unit: c.unit,
    }))
    if (parsed.results) {
      results = toResults(line, { results: input.results ?? [] })
      const comparison = compareWithSpec(line, results)
      if (!comparison.releasable) throw new UnprocessableError(`The corrected values cannot be certified: ${comparison.blockers.join(' ')}`)
    }
    const conditions = {
      validityMonths: parsed.validityMonths ?? monthsBetween(prev.dates.certifiedOn, prev.dates.validUntil),
      minimumUsePressureBarGauge: parsed.minimumUsePressureBarGauge ?? prev.filling.minimumUsePressureBarGauge,
      storageMinC: parsed.storageMinC ?? prev.filling.storageMinC,
      storageMaxC: parsed.storageMaxC ?? prev.filling.storageMaxC,
    }
    if (conditions.storageMinC >= conditions.storageMaxC)
      throw new UnprocessableError('The lower storage temperature must be below the upper one.', [
        { field: 'storageMaxC', message: 'must be above the lower limit' },
      ])
    const now = new Date()
    const revision = old.revision + 1
    content = buildContent({
      run,
      results,
      analysedAt: new Date(`${prev.dates.analysedOn}T12:00:00Z`),
      number: old.number,
      revision,
      conditions,
      signer: user,
      certifiedOn: prev.dates.certifiedOn,
      issuedOn: isoDate(now),
      correction: { replacesRevision: old.revision, reason: parsed.reason },
    })
    // what is not corrected stays as it was printed
    content = {
      ...content,
      customer: prev.customer,
      producer: prev.producer,
      cylinder: prev.cylinder,
      order: prev.order,
      dates: { ...content.dates, preparedOn: prev.dates.preparedOn },
    }
    pdf = await renderCertificatePdf(content)
    const cert = tx.create(CertificateSchema, {
      number: old.number,
      revision,
      replacesId: old.id,
      orderLine: old.orderLine,
      cylinder: old.cylinder,
      analysis,
      customerId: old.customerId,
      content: content as unknown as Record<string, unknown>,
      signatoryId: user.id,
      signatoryName: user.name,
      releasedAt: now,
      validUntil: content.dates.validUntil,
      correctionReason: parsed.reason,
    })
    await tx.flush()
    newId = cert.id
    audit(tx, user, 'certificate.corrected', 'Certificate', cert.id, { number: old.number, revision, replacesId: old.id, reason: parsed.reason })
    contactEmail = (line.order.customer as { contactEmail: string }).contactEmail
    await tx.flush()
  })
  const emailed = await mailCertificate(deps, contactEmail, content, pdf, log)
  const cert = await em.findOneOrFail(CertificateSchema, newId, { populate: CERT_POPULATE })
  const [summary] = await summarise(em, [cert])
  return { certificate: summary, emailed, orderReleased: false }
}

function monthsBetween(from: string, to: string): number {
  const [y1, m1] = from.split('-').map(Number)
  const [y2, m2] = to.split('-').map(Number)
  return (y2 - y1) * 12 + (m2 - m1)
}

/** A draft of the certificate as it would be released now (for review before signing). */
export async function previewCertificate(em: EntityManager, user: SessionUser, runId: number, conditions: Omit<ReleaseInput, 'password'>): Promise<Buffer> {
  const run = await loadRun(em, runId)
  const analysis = await em.findOne(AnalysisSchema, { run: runId })
  if (!analysis?.results.length) throw new ConflictError('Enter the analysis first; the preview prints the certified values.')
  const today = isoDate(new Date())
  const content = buildContent({
    run,
    results: analysis.results,
    analysedAt: analysis.analysedAt ?? null,
    number: 'FWC-DRAFT',
    revision: 1,
    conditions,
    signer: user,
    certifiedOn: today,
    issuedOn: today,
    correction: null,
  })
  return renderCertificatePdf(content, { draft: true })
}

// ---- certificates: list, detail, PDF ------------------------------------------------------------------------

async function visibleCertificate(em: EntityManager, user: SessionUser, id: number): Promise<CertWithContext> {
  const cert = await em.findOne(CertificateSchema, id, { populate: CERT_POPULATE })
  if (!cert) throw new NotFoundError('No certificate with this id.')
  if (!isStaff(user) && (user.customerId === null || cert.customerId !== user.customerId)) throw new NotFoundError('No certificate with this id.')
  return cert as CertWithContext
}

export async function listCertificates(em: EntityManager, user: SessionUser, query: CertificateListQuery): Promise<CertificateSummary[]> {
  const where: Record<string, unknown> = {}
  if (!isStaff(user)) {
    if (user.customerId === null) return []
    where.customerId = user.customerId
  }
  if (query.orderId) where.orderLine = { order: query.orderId }
  const certs = await em.find(CertificateSchema, where, { populate: CERT_POPULATE, orderBy: { releasedAt: 'desc', id: 'desc' }, limit: 500 })
  const list = await summarise(em, certs)
  return query.current === 'true' ? list.filter((c) => c.current) : list
}

export async function certificateDetail(em: EntityManager, user: SessionUser, id: number): Promise<CertificateDetail> {
  const cert = await visibleCertificate(em, user, id)
  const [summary] = await summarise(em, [cert])
  const revisions = await em.find(CertificateSchema, { number: cert.number }, { populate: CERT_POPULATE, orderBy: { revision: 'asc' } })
  return { ...summary, content: cert.content as unknown as CertificateContent, revisions: await summarise(em, revisions) }
}

export async function certificatePdf(
  em: EntityManager,
  user: SessionUser,
  id: number,
  paper: 'A4' | 'LETTER' = 'A4',
): Promise<{ bytes: Buffer; filename: string }> {
  const cert = await visibleCertificate(em, user, id)
  const next = await em.findOne(CertificateSchema, { replacesId: cert.id })
  const content = cert.content as unknown as CertificateContent
  const bytes = await renderCertificatePdf(content, {
    paper,
    ...(next ? { supersededBy: { revision: next.revision, releasedOn: isoDate(next.releasedAt) } } : {}),
  })
  return { bytes, filename: `${cert.number}-rev${cert.revision}.pdf` }
}
