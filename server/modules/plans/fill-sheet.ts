import { getGas, isKnownGas } from '#shared/physics/index.ts'
import type { FillPlanResponse } from '#shared/schemas/fill-plan.ts'
import { MODEL_LABEL } from '#shared/schemas/gas.ts'
import { standingCautions } from '#shared/schemas/plan-cautions.ts'
import { type PlanDetail, PLAN_STATUS_LABEL } from '#shared/schemas/plan.ts'
import { createPdf, pdfTable } from '../../lib/pdf.ts'

/**
 * The printable fill sheet of a stored plan: black and white, A4 or US Letter, order / line / cylinder / plan
 * version and page numbers on every page (the frame of server/lib/pdf.ts). Formulas are written plainly (CO2):
 * the bundled Inter subset has no subscript digits.
 */

/** Characters the bundled Inter subset cannot draw, written out plainly. */
const PLAIN: Record<string, string> = {
  Σ: 'sum ',
  '≥': '>=',
  '≤': '<=',
  '≈': '~',
  '→': '->',
  '←': '<-',
  ρ: 'rho',
  φ: 'phi',
  γ: 'gamma',
  ω: 'omega',
  Δ: 'delta ',
  '√': 'sqrt',
  ᵢ: '_i',
  ⱼ: '_j',
  '₀': '0',
  '₁': '1',
  '₂': '2',
  '₃': '3',
  '₄': '4',
  '₅': '5',
  '₆': '6',
  '₇': '7',
  '₈': '8',
  '₉': '9',
  '⁰': '0',
  '¹': '1',
  '²': '2',
  '³': '3',
}
/** Code points the Latin subset of Inter carries beyond Latin-1 (dashes, quotes, bullet, ellipsis, minus, euro). */
function drawable(cp: number): boolean {
  return cp < 0x250 || (cp >= 0x2010 && cp <= 0x2027) || cp === 0x2212 || cp === 0x20ac || cp === 0x2122 || cp === 0x2030
}
/** Text as the PDF font can print it: known symbols spelled out, anything else undrawable replaced by '?'. */
export function pdfText(text: string): string {
  let out = ''
  for (const ch of text) {
    const mapped = PLAIN[ch]
    if (mapped !== undefined) out += mapped
    else out += drawable(ch.codePointAt(0) ?? 0) ? ch : '?'
  }
  return out
}

const TEMPERATURE_LABEL: Record<string, string> = { C: '°C', F: '°F', K: 'K' }

function formula(gasId: string): string {
  return isKnownGas(gasId) ? getGas(gasId).formula : gasId
}

/** Decimals that match the gauge resolution (e.g. 0.1 bar → 1, 0.05 → 2); default one decimal. */
function pressureDecimals(plan: PlanDetail): number {
  const res = plan.request.gauge?.resolution
  const displayUnit = plan.result.finalPressure.unit
  if (res && res.value > 0 && res.unit === displayUnit) return Math.max(0, Math.min(4, Math.ceil(-Math.log10(res.value) - 1e-9)))
  return displayUnit === 'bar' || displayUnit === 'MPa' ? (displayUnit === 'MPa' ? 3 : 1) : 0
}

function fixed(value: number, decimals: number): string {
  return value.toLocaleString('en-GB', { minimumFractionDigits: decimals, maximumFractionDigits: decimals, useGrouping: false })
}

function massText(q: { value: number; unit: string }): string {
  const decimals = q.unit === 'g' ? 1 : 3
  return `${fixed(q.value, decimals)} ${q.unit}`
}

function specAmount(c: PlanDetail['line']['components'][number]): string {
  if (c.unit === 'ppm' && c.amount !== undefined) return `${c.amount} ppm`
  if (c.unit === 'percent' && c.amount !== undefined) return `${c.amount} %`
  if (c.fraction < 0.001) return `${fixed(c.fraction * 1e6, 1)} ppm`
  return `${fixed(c.fraction * 100, 3)} %`
}

function heading(doc: PDFKit.PDFDocument, text: string) {
  if (doc.y > doc.page.height - doc.page.margins.bottom - 60) doc.addPage()
  doc.moveDown(0.6)
  doc.font('bold').fontSize(11).text(text, doc.page.margins.left)
  doc.font('body').fontSize(9)
  doc.moveDown(0.2)
}

function keyValues(doc: PDFKit.PDFDocument, rows: [string, string][]) {
  const left = doc.page.margins.left
  for (const [k, v] of rows) {
    const y = doc.y
    doc.font('bold').fontSize(9).text(k, left, y, { width: 150 })
    const yAfterKey = doc.y
    doc
      .font('body')
      .fontSize(9)
      .text(pdfText(v), left + 155, y, { width: doc.page.width - doc.page.margins.right - left - 155 })
    doc.y = Math.max(doc.y, yAfterKey)
  }
}

/** A boxed paragraph (cautions): the box follows the text height. */
function boxed(doc: PDFKit.PDFDocument, title: string, text: string) {
  const left = doc.page.margins.left
  const width = doc.page.width - left - doc.page.margins.right
  const h =
    doc
      .font('body')
      .fontSize(9)
      .heightOfString(text, { width: width - 12 }) + 20
  if (doc.y + h > doc.page.height - doc.page.margins.bottom) doc.addPage()
  const y = doc.y
  doc.rect(left, y, width, h).lineWidth(0.8).stroke('#000')
  doc
    .font('bold')
    .fontSize(9)
    .text(title.toUpperCase(), left + 6, y + 4, { width: width - 12 })
  doc
    .font('body')
    .fontSize(9)
    .text(text, left + 6, doc.y + 1, { width: width - 12 })
  doc.x = left
  doc.y = y + h + 4
}

function signOffBoxes(doc: PDFKit.PDFDocument, roles: string[]) {
  const left = doc.page.margins.left
  const width = doc.page.width - left - doc.page.margins.right
  const boxW = (width - (roles.length - 1) * 8) / roles.length
  const h = 64
  if (doc.y + h + 10 > doc.page.height - doc.page.margins.bottom) doc.addPage()
  const y = doc.y
  roles.forEach((role, i) => {
    const x = left + i * (boxW + 8)
    doc.rect(x, y, boxW, h).lineWidth(0.8).stroke('#000')
    doc
      .font('bold')
      .fontSize(8)
      .text(role, x + 4, y + 4, { width: boxW - 8 })
    doc
      .font('body')
      .fontSize(7.5)
      .text('Name', x + 4, y + 22, { width: boxW - 8 })
    doc.text('Signature', x + 4, y + 36, { width: boxW - 8 })
    doc.text('Date / time', x + 4, y + 50, { width: boxW - 8 })
  })
  doc.x = left
  doc.y = y + h + 6
}

export async function buildFillSheetPdf(plan: PlanDetail, options: { size: 'A4' | 'LETTER'; technicianName: string | null }): Promise<Buffer> {
  const result: FillPlanResponse = plan.result
  const { doc, finish } = createPdf({
    title: 'Fill sheet',
    size: options.size,
    ids: {
      Order: `${plan.orderNumber} / line ${plan.lineNo}`,
      Cylinder: plan.cylinder?.serial ?? 'not yet chosen',
      Plan: `v${plan.planVersion}`,
    },
  })
  const pUnit = result.finalPressure.unit
  const tUnit = TEMPERATURE_LABEL[result.fillTemperature.unit] ?? result.fillTemperature.unit
  const pd = pressureDecimals(plan)
  const gauge = (v: number) => `${fixed(v, pd)} ${pUnit} g`
  const abs = (v: number) => `${fixed(v, pd)} ${pUnit} a`

  // status first: a draft or blocked plan must not be filled from
  const notForFilling = plan.status !== 'approved'
  if (notForFilling) {
    boxed(
      doc,
      plan.status === 'superseded' ? 'Superseded: do not fill from this sheet' : 'Not approved: do not fill from this sheet',
      plan.status === 'superseded'
        ? 'A newer version of this plan exists. Use the current approved version.'
        : plan.blocking
          ? pdfText(`A blocking finding stands: ${plan.blockingReason ?? 'see the findings below'}`)
          : 'This plan is waiting for the blender’s approval.',
    )
  }

  doc.font('bold').fontSize(13).text(pdfText(plan.lineDescription), doc.page.margins.left)
  doc
    .font('body')
    .fontSize(9)
    .text(pdfText(`${plan.customer} · ${PLAN_STATUS_LABEL[plan.status]}`))
  doc.moveDown(0.4)

  const balance = plan.line.balanceGas
  keyValues(doc, [
    ['Specification', plan.line.components.map((c) => (c.gas === balance ? `${formula(c.gas)} balance` : `${specAmount(c)} ${formula(c.gas)}`)).join(', ')],
    ['Blend tolerance', `±${plan.line.blendTolerancePct} % relative of each minor component`],
    [
      'Final pressure',
      `${gauge(result.finalGaugePressure.value)} (${abs(result.finalPressure.value)}) settled at ${fixed(result.referenceTemperature.value, 1)} ${TEMPERATURE_LABEL[result.referenceTemperature.unit] ?? ''}`,
    ],
    ['Fill temperature', `${fixed(result.fillTemperature.value, 1)} ${tUnit}; targets below are at this temperature`],
    [
      'Atmospheric pressure',
      `${fixed(result.atmosphericPressure.value, pUnit === 'bar' ? 5 : pUnit === 'psi' ? 3 : 3)} ${pUnit} a (gauge = absolute − atmospheric)`,
    ],
    [
      'Method / model',
      `${result.method === 'gravimetric' ? 'Gravimetric (scale readings)' : 'Partial pressure (gauge readings)'} · equation of state ${MODEL_LABEL[result.model]}`,
    ],
    [
      'Cylinder',
      plan.cylinder
        ? `${plan.cylinder.serial}: ${plan.cylinder.waterVolumeL} L water, ${plan.cylinder.material}, service ${plan.cylinder.servicePressureBar} bar g, test ${plan.cylinder.testPressureBar} bar g, next test ${plan.cylinder.nextTestDate}${plan.cylinder.oxygenClean ? ', oxygen-clean' : ''}; valve ${plan.cylinder.valveOutlet}`
        : `not chosen: plan made for ${plan.line.waterVolumeL} L water capacity; check the cylinder before filling`,
    ],
    [
      'Start condition',
      result.initial.moles.value > 0 ? `${abs(result.initial.pressure.value)} residual gas in the cylinder (counted in the plan)` : 'evacuated cylinder',
    ],
    ['Total gas', `${fixed(result.totalMoles.value, 2)} mol, ${massText(result.totalMass)}`],
    ['Technician', options.technicianName ?? '—'],
  ])

  heading(doc, 'Cautions')
  for (const c of standingCautions([...plan.line.components, ...result.steps.flatMap((s) => s.sourceComposition)])) boxed(doc, c.title, c.text)
  const general = result.warnings.filter((w) => w.step === undefined && w.severity !== 'info')
  for (const w of general) boxed(doc, w.severity === 'block' ? 'Blocked' : 'Caution', pdfText(w.caution ? `${w.message} ${w.caution}` : w.message))

  heading(doc, 'Steps (cumulative targets at the fill temperature)')
  const gravimetric = result.method === 'gravimetric'
  const tableWidth = doc.page.width - doc.page.margins.left - doc.page.margins.right
  const cols = [
    { header: '#', width: 18, align: 'right' as const },
    { header: 'Connect', width: 58 },
    { header: 'Target gauge', width: 60, align: 'right' as const },
    { header: 'Absolute', width: 56, align: 'right' as const },
    { header: 'Window (gauge)', width: 74, align: 'right' as const },
    { header: 'Mass added', width: 52, align: 'right' as const },
    { header: 'Scale reading', width: 60, align: 'right' as const },
  ] as { header: string; width: number; align?: 'left' | 'right' | 'center' }[]
  const used = cols.reduce((s, c) => s + c.width, 0)
  const rest = tableWidth - used
  cols.push({ header: gravimetric ? 'Reading kg / °C' : `Reading ${pUnit} g / °C`, width: rest * 0.6 }, { header: 'Initials', width: rest * 0.4 })
  pdfTable(
    doc,
    cols,
    result.steps.map((s) => [
      String(s.index + 1),
      s.sourceComposition.length > 1 ? pdfText(s.source) : formula(s.gas),
      gauge(s.cumulativeGaugePressure.value),
      abs(s.cumulativePressure.value),
      `${fixed(s.toleranceWindow.gaugePressureLow.value, pd)} – ${fixed(s.toleranceWindow.gaugePressureHigh.value, pd)}`,
      massText(s.massAdded),
      gravimetric
        ? `${massText(s.cumulativeMass)} (${massText(s.toleranceWindow.cumulativeMassLow)} – ${massText(s.toleranceWindow.cumulativeMassHigh)})`
        : massText(s.cumulativeMass),
      '',
      '',
    ]),
  )
  const stepNotes = result.warnings.filter((w) => w.step !== undefined)
  if (stepNotes.length) {
    doc.font('bold').fontSize(9).text('Findings on particular steps')
    for (const w of stepNotes) {
      const label = w.severity === 'block' ? 'BLOCKED' : w.severity === 'caution' ? 'CAUTION' : 'NOTE'
      doc
        .font('body')
        .fontSize(9)
        .text(pdfText(`Step ${(w.step ?? 0) + 1} · ${label}: ${w.message}${w.caution ? ` ${w.caution}` : ''}`), { width: tableWidth })
    }
  }
  doc
    .font('body')
    .fontSize(8)
    .text('Read each step after the gas has settled; a hot cylinder reads high. If the reading is outside its window, stop and re-plan before the next step.', {
      width: tableWidth,
    })

  const temps = result.steps[0]?.temperatureTable ?? []
  if (temps.length) {
    heading(doc, `Target gauge pressure at other gas temperatures (${pUnit} g, same contents)`)
    const first = 80
    const w = (tableWidth - first) / temps.length
    pdfTable(
      doc,
      [
        { header: 'Step', width: first },
        ...temps.map((t) => ({ header: `${fixed(t.temperature.value, 0)} ${TEMPERATURE_LABEL[t.temperature.unit] ?? ''}`, width: w, align: 'right' as const })),
      ],
      result.steps.map((s) => [`${s.index + 1} ${formula(s.gas)}`, ...s.temperatureTable.map((t) => fixed(t.gaugePressure.value, pd))]),
    )
  }

  heading(doc, 'Expected composition (mole fractions, uncertainty k = 2)')
  pdfTable(
    doc,
    [
      { header: 'Component', width: 110 },
      { header: 'Target', width: 100, align: 'right' },
      { header: 'Planned', width: 100, align: 'right' },
      { header: 'Expanded uncertainty', width: tableWidth - 310, align: 'right' },
    ],
    result.predictedComposition.map((c) => {
      const ppm = c.target > 0 && c.target < 0.001
      const f = (x: number) => (ppm ? `${fixed(x * 1e6, 2)} ppm` : `${fixed(x * 100, 4)} %`)
      return [formula(c.gas), c.target > 0 ? f(c.target) : '—', f(c.fraction), `± ${f(c.expandedUncertainty)}`]
    }),
  )
  if (result.minimumSafeTemperature) {
    doc
      .font('body')
      .fontSize(9)
      .text(
        `Lowest temperature for this cylinder (condensation screen): ${fixed(result.minimumSafeTemperature.value, 1)} ${TEMPERATURE_LABEL[result.minimumSafeTemperature.unit] ?? ''}.`,
      )
  }

  if (doc.y > doc.page.height - doc.page.margins.bottom - 110) doc.addPage()
  heading(doc, 'Sign-off')
  signOffBoxes(doc, ['Plan approved (blender)', 'Cylinder checked and filled (technician)', 'Readings checked (QA)'])
  doc
    .font('body')
    .fontSize(8)
    .text('This sheet supports trained staff; it does not replace local codes, the cylinder markings or licensed practice.', doc.page.margins.left)
  return finish()
}
