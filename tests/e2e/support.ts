import { execFileSync } from 'node:child_process'
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { type APIRequestContext, type APIResponse, expect, type Page, request } from '@playwright/test'
import type { Role } from '#shared/schemas/auth.ts'
import { localIsoDate } from '#shared/schemas/cylinder.ts'
import type { OrderDetail, OrderInput } from '#shared/schemas/order.ts'
import type { OrderStatus } from '#shared/schemas/order-lifecycle.ts'
import type { PlanDetail, PlanSummary } from '#shared/schemas/plan.ts'
import type { QaRunDetail, ReleaseResult } from '#shared/schemas/quality.ts'
import type { RunDetail, RunSummary } from '#shared/schemas/run.ts'
import { E2E_INBOX_PORT } from './playwright.config.ts'

export const PASSWORD = 'fillwright-demo'
export const SHOTS = 'test-results/screenshots'
mkdirSync(SHOTS, { recursive: true })

/** The local SMTP fake's inbox as JSON (started beside the app on the e2e ports). */
export const INBOX_URL = `http://127.0.0.1:${E2E_INBOX_PORT}/messages`

/** Viewports of the devices the shop's people use. */
export const TABLET = { width: 1024, height: 768 }
export const PHONE = { width: 390, height: 844 }

export async function signIn(page: Page, role: Role): Promise<void> {
  await page.goto('/sign-in')
  await page.getByLabel('E-mail').fill(`${role}@demo.test`)
  await page.getByLabel('Password').fill(PASSWORD)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await expect(page.getByRole('button', { name: 'Sign out' })).toBeVisible()
}

export async function shot(page: Page, name: string): Promise<void> {
  // from the top, so the sticky header is drawn where it belongs on the full-page picture
  await page.evaluate(() => window.scrollTo(0, 0))
  await page.screenshot({ path: `${SHOTS}/${name}.png`, fullPage: true })
}

const require = createRequire(import.meta.url)
const AXE_SOURCE = require.resolve('axe-core/axe.min.js')

export interface AxeViolation {
  id: string
  impact: string | null
  help: string
  nodes: number
  targets: string[]
}

/**
 * Runs axe-core (WCAG 2.x A/AA rules) in the page and returns the violations. The page's CSP forbids
 * injected scripts, so the script is evaluated through the DevTools protocol instead.
 */
export async function axeViolations(page: Page): Promise<{ id: string; impact: string | null; help: string; nodes: number }[]> {
  return (await axeDetails(page)).map(({ targets: _targets, ...v }) => v)
}

/** As axeViolations, with the CSS targets of the first few offending nodes (for a readable failure). */
export async function axeDetails(page: Page): Promise<AxeViolation[]> {
  const { readFileSync } = await import('node:fs')
  const src = readFileSync(AXE_SOURCE, 'utf8')
  const cdp = await page.context().newCDPSession(page)
  await cdp.send('Runtime.evaluate', { expression: src })
  const result = await cdp.send('Runtime.evaluate', {
    expression: `axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a','wcag2aa','wcag21a','wcag21aa','wcag22aa'] } }).then(r => JSON.stringify(r.violations.map(v => ({ id: v.id, impact: v.impact, help: v.help, nodes: v.nodes.length, targets: v.nodes.slice(0, 5).map(n => n.target.join(' ')) }))))`,
    awaitPromise: true,
    returnByValue: true,
  })
  await cdp.detach()
  return JSON.parse(String(result.result.value)) as AxeViolation[]
}

/** Screenshot the screen, then expect axe to find nothing on it (the failure names rule and elements). */
export async function checkScreen(page: Page, name: string, options: { axe?: boolean } = {}): Promise<void> {
  // the screen as people see it once loaded: no skeleton or busy table left
  await expect(page.locator('[aria-busy="true"]'), `${name}: still loading`).toHaveCount(0)
  await shot(page, name)
  if (options.axe === false) return
  const violations = await axeDetails(page)
  // soft: every screen of the journey is still checked, and the test fails at the end when one had violations
  expect.soft(violations, `axe on ${name} (${page.url()})`).toEqual([])
}

/** Parses "€1,234.56" / "1 234.50 EUR" style amounts to minor units. */
export function moneyToMinor(text: string): number {
  const cleaned = text.replace(/[^\d.,−-]/g, '').replace(/,/g, '')
  const negative = /^[−-]/.test(cleaned)
  const n = Number(cleaned.replace(/[−-]/g, ''))
  if (!Number.isFinite(n)) throw new Error(`not a money amount: ${text}`)
  return Math.round(n * 100) * (negative ? -1 : 1)
}

/** A short tag unique to this test run, for serials, barcodes and names the tests make. */
export function uniqueTag(): string {
  return `${Date.now().toString(36)}${Math.floor(Math.random() * 1296)
    .toString(36)
    .padStart(2, '0')}`.toUpperCase()
}

export function today(): string {
  return localIsoDate()
}

// ---- the API as one role ---------------------------------------------------------------------------------------

/**
 * A signed-in API session of one demo role, with its own cookies (so several roles can act in one test
 * without touching the page's session). Unsafe requests carry the session's CSRF token.
 */
export class Api {
  private constructor(
    readonly ctx: APIRequestContext,
    private csrf: string,
    readonly user: { id: number; email: string; name: string; roles: Role[]; customerId: number | null },
  ) {}

  static async as(baseURL: string, role: Role): Promise<Api> {
    const ctx = await request.newContext({ baseURL })
    const first = await ctx.get('/api/auth/csrf')
    expect(first.ok(), 'GET /api/auth/csrf').toBe(true)
    const { token } = (await first.json()) as { token: string }
    const login = await ctx.post('/api/auth/login', {
      data: { email: `${role}@demo.test`, password: PASSWORD },
      headers: { 'x-csrf-token': token },
    })
    expect(login.status(), `sign in as ${role}: ${await login.text()}`).toBe(200)
    const body = (await login.json()) as { user: Api['user']; csrfToken: string }
    return new Api(ctx, body.csrfToken, body.user)
  }

  private async check<T>(what: string, res: APIResponse): Promise<T> {
    const text = await res.text()
    expect(res.ok(), `${what} answered ${res.status()}: ${text.slice(0, 800)}`).toBe(true)
    return (text ? JSON.parse(text) : null) as T
  }

  async get<T>(path: string): Promise<T> {
    return this.check<T>(`GET ${path}`, await this.ctx.get(path))
  }

  async post<T>(path: string, data: unknown): Promise<T> {
    return this.check<T>(`POST ${path}`, await this.ctx.post(path, { data, headers: { 'x-csrf-token': this.csrf } }))
  }

  async put<T>(path: string, data: unknown): Promise<T> {
    return this.check<T>(`PUT ${path}`, await this.ctx.put(path, { data, headers: { 'x-csrf-token': this.csrf } }))
  }

  async dispose(): Promise<void> {
    await this.ctx.dispose()
  }
}

// ---- demo data the journeys make for themselves ------------------------------------------------------------------

export interface CustomerRow {
  id: number
  code: string
  company: string
  contactEmail: string
}

export async function customerByCode(api: Api, code: string): Promise<CustomerRow> {
  const list = await api.get<{ items: CustomerRow[] }>('/api/customers')
  const c = list.items.find((x) => x.code === code)
  if (!c) throw new Error(`demo customer ${code} is missing`)
  return c
}

/** A quote sent to the customer by the sales desk (draft entered, then sent). */
export async function sendQuote(sales: Api, input: OrderInput): Promise<OrderDetail> {
  const draft = await sales.post<OrderDetail>('/api/orders', input)
  return sales.post<OrderDetail>(`/api/orders/${draft.id}/transition`, { to: 'quoted', version: draft.version })
}

export async function moveOrder(api: Api, id: number, to: OrderStatus): Promise<OrderDetail> {
  const order = await api.get<OrderDetail>(`/api/orders/${id}`)
  return api.post<OrderDetail>(`/api/orders/${id}/transition`, { to, version: order.version })
}

/** A new shop cylinder, evacuated and in test, with a barcode no other test uses. */
export async function createCylinder(keeper: Api, spec: CylinderSpec): Promise<{ id: number; serial: string; barcode: string }> {
  const tag = uniqueTag()
  const now = new Date()
  const last = new Date(now)
  last.setMonth(last.getMonth() - 6)
  const next = new Date(last)
  next.setFullYear(next.getFullYear() + 10)
  return keeper.post('/api/cylinders', {
    serial: `E2E-${tag}`,
    barcode: `E2E${tag}`,
    ...spec,
    lastTestDate: localIsoDate(last),
    nextTestDate: localIsoDate(next),
  })
}

/** The approved (not blocked) plan of an order line that matches, from the seeded demo plans. */
export async function approvedPlan(blender: Api, match: { customer: string; description: RegExp }): Promise<{ id: number; orderNumber: string }> {
  const plans = await blender.get<{ items: PlanSummary[] }>('/api/plans?status=approved&limit=200')
  const plan = plans.items.find((p) => !p.blocking && p.customer === match.customer && match.description.test(p.lineDescription))
  if (!plan) throw new Error(`no approved plan for ${match.customer} ${match.description}`)
  return plan
}

/** Books one cylinder on a plan for the demo technician today; returns the new run. */
export async function bookRun(blender: Api, planId: number, cylinderId: number, technicianId: number): Promise<RunSummary> {
  const runs = await blender.post<RunSummary[]>('/api/runs', { planId, cylinderIds: [cylinderId], technicianId, scheduledFor: today() })
  expect(runs).toHaveLength(1)
  return runs[0]
}

let requestSeq = 0
const requestId = () => `e2e-${uniqueTag()}-${++requestSeq}`.replace(/[^A-Za-z0-9_-]/g, '')

/**
 * Records every remaining step of a run at its planned target (gauge pressure at the fill temperature, the
 * scale at its planned mass on a gravimetric step), then finishes the run.
 */
export async function fillRunOnTarget(filler: Api, runId: number): Promise<RunDetail> {
  let run = await filler.get<RunDetail>(`/api/runs/${runId}`)
  for (let guard = 0; guard < 20 && !run.allStepsDone; guard++) {
    const step = run.steps[run.currentStep]
    if (!step) break
    const result = await filler.post<{ run: RunDetail; reading: { outcome: string } }>(`/api/runs/${runId}/readings`, {
      stepIndex: step.index,
      pressure:
        step.kind === 'evacuate'
          ? { value: step.cumulativePressure.value, unit: 'bar', reference: 'absolute' }
          : { value: step.cumulativeGaugePressure.value, unit: 'bar', reference: 'gauge' },
      temperature: { value: run.fillTemperature.value, unit: 'C' },
      ...(run.method === 'gravimetric' && step.cumulativeMass ? { scaleMass: { value: step.cumulativeMass.value, unit: 'kg' } } : {}),
      clientRequestId: requestId(),
      expectedVersion: run.version,
    })
    expect(result.reading.outcome, `step ${step.index + 1} of run ${runId} recorded at its target`).toBe('on-target')
    run = result.run
  }
  expect(run.allStepsDone, `every step of run ${runId} recorded`).toBe(true)
  return filler.post<RunDetail>(`/api/runs/${runId}/complete`, { expectedVersion: run.version })
}

export interface InboxMessage {
  id: number
  to: string[]
  subject: string
  text: string
  attachments: { filename: string; contentType: string; size: number }[]
}

/** Waits until the local mailbox holds a message that matches, and returns it. */
export async function waitForMail(match: (m: InboxMessage) => boolean, what: string): Promise<InboxMessage> {
  let found: InboxMessage | undefined
  await expect
    .poll(
      async () => {
        const res = await fetch(INBOX_URL)
        const messages = (await res.json()) as InboxMessage[]
        found = messages.find(match)
        return found !== undefined
      },
      { message: `the local mailbox receives ${what}`, timeout: 15_000 },
    )
    .toBe(true)
  return found as InboxMessage
}

export interface CylinderSpec {
  waterVolumeL: number
  servicePressureBar: number
  testPressureBar: number
  material: 'steel' | 'aluminium'
  valveOutlet: string
  oxygenClean: boolean
}

/**
 * A cylinder filled and finished at the manifold, waiting for QA: a new cylinder booked on a seeded approved plan
 * for the demo technician, every step recorded on target and the run finished (all through the API).
 */
export async function completedRun(
  baseURL: string,
  plan: { customer: string; description: RegExp },
  cylinder: CylinderSpec,
): Promise<{ runId: number; serial: string; orderNumber: string }> {
  const blender = await Api.as(baseURL, 'blender')
  const technician = await Api.as(baseURL, 'technician')
  try {
    const p = await approvedPlan(blender, plan)
    const c = await createCylinder(blender, cylinder)
    const run = await bookRun(blender, p.id, c.id, technician.user.id)
    const done = await fillRunOnTarget(technician, run.id)
    expect(done.status).toBe('completed')
    return { runId: run.id, serial: c.serial, orderNumber: p.orderNumber }
  } finally {
    await blender.dispose()
    await technician.dispose()
  }
}

/** Checks a PDF answer (status, content type, magic bytes) and returns its text (poppler's pdftotext), spaces collapsed. */
export async function pdfTextOf(res: APIResponse): Promise<string> {
  expect(res.status(), `PDF ${res.url()}`).toBe(200)
  expect(res.headers()['content-type']).toContain('application/pdf')
  const bytes = await res.body()
  expect(bytes.subarray(0, 5).toString('latin1')).toBe('%PDF-')
  const dir = mkdtempSync(join(tmpdir(), 'fw-e2e-pdf-'))
  try {
    const file = join(dir, 'doc.pdf')
    writeFileSync(file, bytes)
    return execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ')
  } finally {
    rmSync(dir, { recursive: true, force: true })
  }
}

/** One mixture line as the sales desk enters it: `quantity` cylinders of CO2 in N2 at 150 bar in 10 L aluminium. */
export function co2InNitrogen(customerId: number, reference: string, percent: number, quantity = 1): OrderInput {
  return {
    customerId,
    reference,
    neededBy: null,
    rentalDays: 30,
    notes: '',
    lines: [
      {
        description: '',
        components: [{ gas: 'carbon-dioxide', amount: percent, unit: 'percent' }],
        balanceGas: 'nitrogen',
        blendTolerancePct: 5,
        certificationUncertaintyPct: 5,
        waterVolumeL: 10,
        valveOutlet: 'DIN 477 No. 14',
        quantity,
        finalPressureBarGauge: 150,
        method: 'partial-pressure',
      },
    ],
  }
}

export interface FilledOrder {
  orderId: number
  orderNumber: string
  runId: number
  serial: string
}

/**
 * A one-cylinder order of `percentCo2` % CO2 in N2 taken through the API to QA's door: the sales desk quotes it and
 * the quote is accepted, the blender plans it (Peng–Robinson), approves the plan and books a new cylinder, and the
 * technician fills it on target and finishes the run.
 */
export async function filledOrder(baseURL: string, customerCode: string, percentCo2: number): Promise<FilledOrder> {
  const sales = await Api.as(baseURL, 'sales')
  const blender = await Api.as(baseURL, 'blender')
  const technician = await Api.as(baseURL, 'technician')
  try {
    const customer = await customerByCode(sales, customerCode)
    const quoted = await sendQuote(sales, co2InNitrogen(customer.id, `E2E lifecycle ${uniqueTag()}`, percentCo2))
    await moveOrder(sales, quoted.id, 'accepted')

    const plan = await blender.post<PlanDetail>('/api/plans', { orderLineId: quoted.lines[0].id, cylinderId: null, options: { model: 'peng-robinson' } })
    expect(plan.blocking, `plan for ${quoted.number}: ${plan.blockingReason ?? ''}`).toBe(false)
    await blender.post(`/api/plans/${plan.id}/approve`, { version: plan.version })
    expect((await sales.get<OrderDetail>(`/api/orders/${quoted.id}`)).status).toBe('planned')

    const cylinder = await createCylinder(blender, {
      waterVolumeL: 10,
      servicePressureBar: 200,
      testPressureBar: 300,
      material: 'aluminium',
      valveOutlet: 'DIN 477 No. 14',
      oxygenClean: false,
    })
    const run = await bookRun(blender, plan.id, cylinder.id, technician.user.id)
    await fillRunOnTarget(technician, run.id)
    expect((await sales.get<OrderDetail>(`/api/orders/${quoted.id}`)).status).toBe('analysis')
    return { orderId: quoted.id, orderNumber: quoted.number, runId: run.id, serial: cylinder.serial }
  } finally {
    for (const api of [sales, blender, technician]) await api.dispose()
  }
}

/** The analysis QA enters for a filled CO2-in-N2 order: 1 % relative above the target, U 2 % relative (k = 2). */
export function co2Analysis(percentCo2: number) {
  return {
    results: [
      {
        gas: 'carbon-dioxide',
        value: Number((percentCo2 * 1.01).toFixed(4)),
        unit: 'percent',
        expandedUncertainty: Number((percentCo2 * 0.02).toFixed(4)),
        coverageFactor: 2,
        instrument: 'NDIR bench analyser 1',
        method: 'NDIR, two-point bracketing',
      },
    ],
  }
}

export interface ShippedAndInvoiced extends FilledOrder {
  certificate: { id: number; number: string }
  invoice: { id: number; number: string | null; amountMinor: number; hostedUrl: string | null; status: string }
}

/**
 * A whole order through the API, one cylinder from quote to invoice: filledOrder, then QA enters an analysis within
 * specification and signs the certificate with the release conditions it proposes, and the sales desk ships and
 * invoices the order.
 */
export async function invoicedOrder(baseURL: string, customerCode: string, percentCo2: number): Promise<ShippedAndInvoiced> {
  const filled = await filledOrder(baseURL, customerCode, percentCo2)
  const sales = await Api.as(baseURL, 'sales')
  const qa = await Api.as(baseURL, 'qa')
  try {
    const detail = await qa.put<QaRunDetail>(`/api/quality/runs/${filled.runId}/analysis`, co2Analysis(percentCo2))
    expect(detail.analysis?.verdict).toBe('within-tolerance')
    const d = detail.releaseDefaults
    const released = await qa.post<ReleaseResult>(`/api/quality/runs/${filled.runId}/release`, {
      password: PASSWORD,
      validityMonths: d.validityMonths,
      minimumUsePressureBarGauge: d.minimumUsePressureBarGauge,
      storageMinC: d.storageMinC,
      storageMaxC: d.storageMaxC,
    })
    expect(released.orderReleased).toBe(true)

    await moveOrder(sales, filled.orderId, 'shipped')
    const invoiced = await sales.post<{ invoice: ShippedAndInvoiced['invoice'] }>('/api/invoices', { orderId: filled.orderId })
    return { ...filled, certificate: { id: released.certificate.id, number: released.certificate.number }, invoice: invoiced.invoice }
  } finally {
    for (const api of [sales, qa]) await api.dispose()
  }
}
