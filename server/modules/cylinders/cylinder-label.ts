import bwipjs from 'bwip-js/node'
import { localIsoDate } from '#shared/schemas/cylinder.ts'
import { createPdf } from '../../lib/pdf.ts'
import type { Cylinder } from './cylinder.entity.ts'
import { cylinderBlock } from './cylinders.service.ts'

const MM = 72 / 25.4

/** Plain-words cautions printed on every label (common practice for compressed-gas cylinders, no single source). */
export const LABEL_CAUTIONS = [
  'HIGH-PRESSURE GAS CYLINDER.',
  'Secure upright or chained; keep the valve guard or cap on when moving.',
  'Open the valve slowly, by hand, never with the outlet pointed at anyone.',
  'Do not fill above the marked service pressure, and never after the next test date.',
  'Keep away from heat and flames. Follow local codes, the cylinder markings and licensed practice.',
]
export const OXYGEN_CLEAN_CAUTION = 'Oxygen-clean: keep oil, grease and dirt away from valve and fittings.'

/**
 * A cylinder label as a PDF: serial, Code 128 of the barcode field, a QR code linking to the cylinder's page,
 * water volume, service and test pressure, next test date and the high-pressure caution. Printed black on
 * white inside a cut line, on A4 or US Letter.
 */
export async function cylinderLabelPdf(c: Cylinder, options: { publicUrl: string; size?: 'A4' | 'LETTER' }): Promise<Buffer> {
  const code128 = await bwipjs.toBuffer({ bcid: 'code128', text: c.barcode, scale: 3, height: 14, includetext: true, textxalign: 'center', textsize: 11 })
  const qrText = `${options.publicUrl.replace(/\/$/, '')}/cylinders/${c.id}`
  const qr = await bwipjs.toBuffer({ bcid: 'qrcode', text: qrText, scale: 4 })
  const today = localIsoDate()
  const block = cylinderBlock(c, today)

  const { doc, finish } = createPdf({ title: 'Cylinder label', ids: { Cylinder: c.serial, Barcode: c.barcode }, size: options.size })
  const left = doc.page.margins.left
  const top = doc.page.margins.top
  const width = 120 * MM
  const pad = 5 * MM

  let y = top + pad
  const x = left + pad
  const inner = width - 2 * pad
  const qrSize = 26 * MM
  doc
    .font('bold')
    .fontSize(18)
    .fillColor('#000')
    .text(c.serial, x, y, { width: inner - qrSize - pad, lineBreak: false })
  doc
    .font('body')
    .fontSize(8)
    .text('Serial number', x, y + 22, { width: inner - qrSize - pad })
  doc.image(qr, x + inner - qrSize, y, { width: qrSize, height: qrSize })
  doc.image(code128, x, y + 34, { fit: [inner - qrSize - pad, 16 * MM] })

  y += Math.max(qrSize, 34 + 16 * MM) + 3 * MM
  const rows: [string, string][] = [
    ['Water volume', `${c.waterVolumeL} L`],
    ['Service pressure', `${c.servicePressureBar} bar (gauge, at 15 °C)`],
    ['Test pressure', `${c.testPressureBar} bar (gauge)`],
    ['Next periodic test', c.nextTestDate],
    ['Material / valve outlet', `${c.material} / ${c.valveOutlet}`],
    ['Oxygen-clean', c.oxygenClean ? 'yes' : 'no'],
  ]
  const labelWidth = 38 * MM
  for (const [k, v] of rows) {
    doc.font('body').fontSize(8.5).text(k, x, y, { width: labelWidth, lineBreak: false })
    doc
      .font('bold')
      .fontSize(9.5)
      .text(v, x + labelWidth, y - 0.5, { width: inner - labelWidth, lineBreak: false })
    y += 12.5
  }
  if (block.blocked) {
    y += 2
    doc.save().rect(x, y, inner, 14).fill('#000').restore()
    doc
      .font('bold')
      .fontSize(9)
      .fillColor('#fff')
      .text('DO NOT FILL — periodic test overdue or cylinder held back', x + 4, y + 3, { width: inner - 8, lineBreak: false })
    doc.fillColor('#000')
    y += 17
  }

  // caution box: never optional, printed on every label
  y += 3
  const cautionText = [...LABEL_CAUTIONS.slice(1), ...(c.oxygenClean ? [OXYGEN_CLEAN_CAUTION] : [])].join(' ')
  doc.font('body').fontSize(7.5)
  const textHeight = doc.heightOfString(cautionText, { width: inner - 8 })
  const boxHeight = textHeight + 20
  doc.save().lineWidth(1.2).rect(x, y, inner, boxHeight).stroke('#000').restore()
  doc
    .font('bold')
    .fontSize(8.5)
    .text(`! ${LABEL_CAUTIONS[0]}`, x + 4, y + 3, { width: inner - 8 })
  doc
    .font('body')
    .fontSize(7.5)
    .text(cautionText, x + 4, y + 15, { width: inner - 8 })
  const height = y + boxHeight + pad - top

  // cut line around everything above
  doc.save().lineWidth(0.6).dash(4, { space: 3 }).rect(left, top, width, height).stroke('#000').undash().restore()

  doc
    .font('body')
    .fontSize(8)
    .text(`Printed ${today}. Scan the QR code to open this cylinder in Fillwright.`, left, top + height + 6 * MM, { width })
  return finish()
}
