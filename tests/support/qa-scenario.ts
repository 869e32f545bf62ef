import { execFileSync } from 'node:child_process'
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import type { EntityManager, MikroORM } from '@mikro-orm/core'
import { CustomerSchema } from '#server/modules/customers/customer.entity.ts'
import { CylinderSchema } from '#server/modules/cylinders/cylinder.entity.ts'
import { OrderLineSchema, OrderSchema } from '#server/modules/orders/order.entity.ts'
import { FillPlanSchema } from '#server/modules/plans/fill-plan.entity.ts'
import { FillRunSchema } from '#server/modules/runs/fill-run.entity.ts'
import type { OrderStatus } from '#shared/schemas/order-lifecycle.ts'
import type { LinePricing } from '#shared/schemas/quote.ts'

/**
 * Test data for QA and billing: an order with one mixture line, and for each cylinder an approved plan and a
 * completed fill run — as the blender and technician would have left them. Invented values.
 */
export interface QaScenario {
  orderId: number
  orderNumber: string
  lineId: number
  customerId: number
  runIds: number[]
  cylinderIds: number[]
}

let seq = 0

export interface ScenarioOptions {
  /** customer code from the demo seed (ALDB is the one with a portal user) */
  customerCode?: string
  status?: OrderStatus
  cylinders?: number
  /** the line's pricing breakdown (billing tests) */
  pricing?: LinePricing | null
  priceMinor?: number
  method?: 'gravimetric' | 'partial-pressure'
}

/**
 * 2 % mol/mol CO2 and 500 µmol/mol CO in nitrogen, blend tolerance ±5 %, certification uncertainty 2 % (k = 2),
 * 150 bar gauge at 15 °C in 10 L cylinders.
 */
export async function createQaScenario(orm: MikroORM, options: ScenarioOptions = {}): Promise<QaScenario> {
  const em: EntityManager = orm.em.fork()
  const n = ++seq
  const customer = await em.findOneOrFail(CustomerSchema, { code: options.customerCode ?? 'ALDB' })
  const count = options.cylinders ?? 1
  const cylinders = Array.from({ length: count }, (_, i) =>
    em.create(CylinderSchema, {
      serial: `KR-T10-${process.pid % 10000}-${n}-${i + 1}`,
      barcode: `FWT${process.pid % 10000}-${n}-${i + 1}`,
      waterVolumeL: 10,
      servicePressureBar: 200,
      testPressureBar: 300,
      material: 'aluminium',
      valveOutlet: 'DIN 477 No. 14',
      oxygenClean: false,
      owner: null,
      lastTestDate: '2024-03-01',
      nextTestDate: '2034-03-01',
      status: 'awaiting-analysis',
      residual: { kind: 'evacuated' },
    }),
  )
  const order = em.create(OrderSchema, {
    number: `FW-T${process.pid % 10000}-${String(n).padStart(4, '0')}`,
    customer,
    status: options.status ?? 'analysis',
    reference: `PO-${n}`,
    currency: 'EUR',
    totalMinor: options.priceMinor ?? 0,
  })
  const line = em.create(OrderLineSchema, {
    order,
    lineNo: 1,
    description: '2 % CO2, 500 ppm CO in N2',
    components: [
      { gas: 'carbon-dioxide', fraction: 0.02, amount: 2, unit: 'percent' },
      { gas: 'carbon-monoxide', fraction: 0.0005, amount: 500, unit: 'ppm' },
      { gas: 'nitrogen', fraction: 0.9795 },
    ],
    balanceGas: 'nitrogen',
    blendTolerancePct: 5,
    certificationUncertaintyPct: 2,
    waterVolumeL: 10,
    valveOutlet: 'DIN 477 No. 14',
    quantity: count,
    finalPressureBarGauge: 150,
    method: options.method ?? 'gravimetric',
    priceMinor: options.priceMinor ?? 0,
    pricing: options.pricing ?? null,
  })
  await em.flush()
  const runIds: number[] = []
  for (const cylinder of cylinders) {
    const plan = em.create(FillPlanSchema, {
      orderLine: line,
      cylinder,
      planVersion: 1,
      status: 'approved',
      model: 'peng-robinson',
      method: options.method ?? 'gravimetric',
      request: {},
      result: { minimumSafeTemperature: null },
    })
    const run = em.create(FillRunSchema, {
      plan,
      cylinder,
      technicianId: null,
      scheduledFor: new Date().toISOString().slice(0, 10),
      status: 'completed',
      targets: {},
      startedAt: new Date(Date.now() - 3600_000),
      completedAt: new Date(),
    })
    await em.flush()
    runIds.push(run.id)
  }
  return { orderId: order.id, orderNumber: order.number, lineId: line.id, customerId: customer.id, runIds, cylinderIds: cylinders.map((c) => c.id) }
}

/** The text of a PDF, extracted with poppler's pdftotext (installed by .ci/run). */
export function pdfText(pdf: Buffer): string {
  const dir = mkdtempSync(join(tmpdir(), 'fw-pdf-'))
  try {
    const file = join(dir, 'doc.pdf')
    writeFileSync(file, pdf)
    return execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' })
  } finally {
    rmSync(dir, { recursive: true, force: true })
  }
}

/** A small valid PDF (what a lab instrument's report export might look like). */
export function minimalPdf(text = 'Analysis report'): Buffer {
  const objects = [
    '<< /Type /Catalog /Pages 2 0 R >>',
    '<< /Type /Pages /Kids [3 0 R] /Count 1 >>',
    '<< /Type /Page /Parent 2 0 R /MediaBox [0 0 200 200] /Contents 4 0 R >>',
  ]
  const stream = `BT /F1 12 Tf 20 100 Td (${text}) Tj ET`
  objects.push(`<< /Length ${stream.length} >>\nstream\n${stream}\nendstream`)
  let body = '%PDF-1.4\n'
  const offsets: number[] = []
  objects.forEach((o, i) => {
    offsets.push(body.length)
    body += `${i + 1} 0 obj\n${o}\nendobj\n`
  })
  const xref = body.length
  body += `xref\n0 ${objects.length + 1}\n0000000000 65535 f \n${offsets.map((o) => `${String(o).padStart(10, '0')} 00000 n \n`).join('')}`
  body += `trailer\n<< /Size ${objects.length + 1} /Root 1 0 R >>\nstartxref\n${xref}\n%%EOF\n`
  return Buffer.from(body, 'latin1')
}
