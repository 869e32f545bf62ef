import { COMPOSITION_UNIT_LABEL, type CertificateContent } from '#shared/schemas/quality.ts'
import { createPdf, pdfTable } from '../../lib/pdf.ts'

/** a number with a true minus sign */
const signed = (n: number) => (n < 0 ? `−${Math.abs(n)}` : String(n))

export interface CertificateStamp {
  /** paper size (A4 default) */
  paper?: 'A4' | 'LETTER'
  /** draft preview before release */
  draft?: boolean
  /** a later revision replaces this one */
  supersededBy?: { revision: number; releasedOn: string }
}

/**
 * The certificate of composition as a PDF (A4, black and white), from the content frozen at release. Carries
 * what ISO 6141 asks of a certificate for a calibration gas mixture: unique number and page n of N, producer,
 * container identification, certified composition with expanded uncertainty and coverage factor, balance gas,
 * preparation and analysis methods, traceability, dates and validity, filling pressure, minimum use pressure,
 * storage limits, and the authorising signatory — plus the cylinder's hazard statement and cautions.
 */
export async function renderCertificatePdf(c: CertificateContent, stamp: CertificateStamp = {}): Promise<Buffer> {
  const { doc, finish } = createPdf({
    title: 'Certificate of composition',
    ids: { Certificate: `${c.number} rev. ${c.revision}`, Order: c.order.number, Cylinder: c.cylinder.serial },
    size: stamp.paper ?? 'A4',
  })
  const left = doc.page.margins.left
  const width = doc.page.width - left - doc.page.margins.right

  const heading = (text: string) => {
    if (doc.y > doc.page.height - doc.page.margins.bottom - 60) doc.addPage()
    doc.moveDown(0.6)
    doc.font('bold').fontSize(10.5).text(text, left, doc.y, { width })
    doc.moveDown(0.2)
    doc.font('body').fontSize(9.5)
  }
  const pairs = (rows: [string, string][]) => {
    for (const [k, v] of rows) {
      const y = doc.y
      doc.font('bold').fontSize(9).text(k, left, y, { width: 150 })
      const hk = doc.y - y
      doc
        .font('body')
        .fontSize(9)
        .text(v, left + 155, y, { width: width - 155 })
      doc.y = Math.max(doc.y, y + hk)
    }
  }
  const boxed = (text: string, strong: boolean) => {
    const y = doc.y
    const h =
      doc
        .font('bold')
        .fontSize(10)
        .heightOfString(text, { width: width - 16 }) + 12
    doc
      .lineWidth(strong ? 2 : 1)
      .rect(left, y, width, h)
      .stroke('#000')
    doc
      .font('bold')
      .fontSize(10)
      .text(text, left + 8, y + 6, { width: width - 16 })
    doc.y = y + h + 6
    doc.x = left
  }

  doc.font('bold').fontSize(15).text(c.title, left, doc.y, { width })
  doc.font('body').fontSize(10).text(`Certificate no. ${c.number}, revision ${c.revision} — issued ${c.dates.issuedOn}`, { width })
  doc.moveDown(0.4)
  if (stamp.draft) boxed('DRAFT FOR REVIEW — not released and not valid as a certificate. Number and dates are provisional.', true)
  if (stamp.supersededBy)
    boxed(
      `SUPERSEDED by revision ${stamp.supersededBy.revision} of ${stamp.supersededBy.releasedOn}. Do not use this revision; ask for or download the current one.`,
      true,
    )
  if (c.correction)
    boxed(`This revision ${c.revision} replaces revision ${c.correction.replacesRevision} of certificate ${c.number}. Reason: ${c.correction.reason}`, false)

  heading('1. Producer and certifying laboratory')
  pairs([
    ['Name', c.producer.name],
    ['Address', c.producer.address],
    ['Contact', `${c.producer.phone} · ${c.producer.email}`],
  ])

  heading('2. Customer')
  pairs([
    ['Customer', `${c.customer.company} (${c.customer.contactName})`],
    ['Order', `${c.order.number}, line ${c.order.lineNo}${c.order.reference ? ` — your reference ${c.order.reference}` : ''}`],
    ['Mixture', c.order.description],
  ])

  heading('3. Container')
  pairs([
    ['Cylinder serial number', c.cylinder.serial],
    ['Barcode', c.cylinder.barcode],
    ['Water volume', `${c.cylinder.waterVolumeL} L`],
    ['Material', c.cylinder.material],
    ['Valve outlet', c.cylinder.valveOutlet],
    ['Service pressure', `${c.cylinder.servicePressureBar} bar (gauge)`],
    ['Next periodic test', c.cylinder.nextTestDate],
  ])

  heading('4. Certified composition (amount fraction)')
  pdfTable(
    doc,
    [
      { header: 'Component', width: 128 },
      { header: 'Certified value', width: 70, align: 'right' },
      { header: 'Expanded uncertainty U (±)', width: 84, align: 'right' },
      { header: 'Unit', width: 62 },
      { header: 'Coverage factor k', width: 56, align: 'right' },
      { header: 'Analytical method', width: width - 400 },
    ],
    [
      ...c.composition.map((r) => [
        `${r.name} (${r.formula})`,
        r.valueText,
        r.uncertaintyText,
        COMPOSITION_UNIT_LABEL[r.unit],
        String(r.coverageFactor),
        r.method,
      ]),
      [`${c.balanceGas.name} (${c.balanceGas.formula})`, 'balance', '', '', '', 'remainder to 1 mol/mol'],
    ],
  )
  const ks = [...new Set(c.composition.map((r) => r.coverageFactor))]
  doc
    .font('body')
    .fontSize(8.5)
    .text(
      `The expanded uncertainty U is the combined standard uncertainty multiplied by the coverage factor k (${ks
        .map((k) => `k = ${k}`)
        .join(', ')}); with k = 2 the coverage probability is approximately 95 % (JCGM 100:2008, GUM). ` +
        'Values are amount (mole) fractions of the gas phase.',
      left,
      doc.y,
      { width },
    )

  heading('5. Preparation and analysis')
  pairs([
    ['Preparation method', `${c.preparation.label} (${c.preparation.reference})`],
    ['Certification method', c.analysis.reference],
    ['Analytical methods', c.analysis.methods.join('; ')],
    ['Instruments', c.analysis.instruments.join('; ')],
  ])

  heading('6. Metrological traceability')
  doc.font('body').fontSize(9).text(c.traceability, left, doc.y, { width })

  heading('7. Filling, storage and use')
  pairs([
    ['Filling pressure', `${c.filling.pressureBarGauge} bar (gauge) at ${c.filling.referenceTemperatureC} °C, settled`],
    ['Minimum use pressure', `Do not use below ${c.filling.minimumUsePressureBarGauge} bar (gauge)`],
    ['Storage and use temperature', `Between ${signed(c.filling.storageMinC)} °C and ${signed(c.filling.storageMaxC)} °C`],
  ])

  heading('8. Dates')
  pairs([
    ['Prepared', c.dates.preparedOn],
    ['Analysed', c.dates.analysedOn],
    ['Certified', c.dates.certifiedOn],
    ['This revision issued', c.dates.issuedOn],
    ['Valid until', `${c.dates.validUntil} (period of validity of the certified values)`],
  ])

  heading('9. Hazard statement and cautions')
  doc.font('bold').fontSize(9).text(c.hazard.statement, left, doc.y, { width })
  doc.moveDown(0.2)
  doc.font('body').fontSize(9)
  for (const caution of c.hazard.cautions) doc.text(`•  ${caution}`, left + 6, doc.y, { width: width - 6 })

  heading('10. Authorisation')
  pairs([
    ['Authorised by', `${c.signatory.name}, ${c.signatory.capacity}`],
    ['Signature', `Signed electronically on ${c.dates.issuedOn} by ${c.signatory.name} (${c.signatory.email}), confirmed with the signatory's password.`],
  ])
  doc.moveDown(0.6)
  doc
    .font('body')
    .fontSize(8)
    .text(
      `This certificate relates only to cylinder ${c.cylinder.serial}. It may be reproduced only in full. A later revision of this certificate number, if any, replaces this one.`,
      left,
      doc.y,
      { width },
    )
  return finish()
}
