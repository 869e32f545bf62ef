import { FILL_METHOD_LABEL, type OrderDetail } from '#shared/schemas/order.ts'
import { formatMoney, PRICE_VOLUME_REFERENCE_LABEL } from '#shared/schemas/pricing.ts'
import { createPdf, pdfTable } from '../../lib/pdf.ts'
import type { Customer } from '../customers/customer.entity.ts'

/**
 * The quote as a black-and-white A4 PDF: customer, validity, one row per mixture, the gas use and price
 * breakdown per cylinder, totals, the reference conditions of every standard volume, and the safety cautions of
 * the mixtures. Order and page numbers are on every page (the shared PDF frame). The bundled Inter subset has no
 * subscript digits or "≤"/"→" glyphs, so formulas are written CO2 and the text avoids those signs.
 */
export async function buildQuotePdf(
  order: OrderDetail,
  customer: Pick<Customer, 'code' | 'company' | 'contactName' | 'contactEmail' | 'phone' | 'billingAddress'>,
): Promise<Buffer> {
  const draft = order.status === 'draft'
  const { doc, finish } = createPdf({ title: draft ? 'Quotation (draft, not sent)' : 'Quotation', ids: { Order: order.number, Customer: customer.code } })
  const money = (minor: number) => formatMoney(minor, order.currency)
  const left = doc.page.margins.left
  const width = doc.page.width - doc.page.margins.left - doc.page.margins.right

  // addressee and quote facts side by side
  const top = doc.y
  doc
    .font('bold')
    .fontSize(10)
    .text(customer.company, left, top, { width: width * 0.55 })
  doc.font('body').fontSize(9)
  doc.text(`Attn. ${customer.contactName}`, { width: width * 0.55 })
  if (customer.billingAddress) doc.text(customer.billingAddress, { width: width * 0.55 })
  doc.text(customer.contactEmail, { width: width * 0.55 })
  const leftBottom = doc.y
  const facts: [string, string][] = [
    ['Quote', order.number],
    ['Date', (order.quoteSentAt ?? new Date().toISOString()).slice(0, 10)],
    ['Valid until', order.quoteValidUntil ?? 'on sending'],
    ['Your reference', order.reference || '—'],
    ['Needed by', order.neededBy ?? 'not stated'],
  ]
  let y = top
  for (const [k, v] of facts) {
    doc
      .font('body')
      .fontSize(9)
      .text(k, left + width * 0.6, y, { width: width * 0.17 })
    doc
      .font('bold')
      .fontSize(9)
      .text(v, left + width * 0.77, y, { width: width * 0.23 })
    y = doc.y + 1
  }
  doc.x = left
  doc.y = Math.max(leftBottom, y) + 14

  doc
    .font('body')
    .fontSize(9)
    .text(
      'Thank you for your enquiry. We quote for the gas mixtures below, filled to the settled pressure stated (bar gauge at 15 °C), ' +
        `certified as stated. Standard volumes are at ${PRICE_VOLUME_REFERENCE_LABEL}. Prices exclude VAT and transport.`,
      left,
      doc.y,
      { width },
    )
  doc.moveDown(0.8)

  // one row per line
  pdfTable(
    doc,
    [
      { header: '#', width: 22 },
      { header: 'Mixture (amount fractions)', width: 170 },
      { header: 'Cylinder and fill', width: 131 },
      { header: 'Qty', width: 30, align: 'right' },
      { header: 'Per cylinder', width: 65, align: 'right' },
      { header: 'Line total', width: width - 418, align: 'right' },
    ],
    order.lines.map((l) => [
      String(l.lineNo),
      `${l.description}\nBlend tolerance ${l.blendTolerancePct} % rel.; certified to ${l.certificationUncertaintyPct} % rel. (k = 2); ${FILL_METHOD_LABEL[l.method].toLowerCase()}`,
      `${l.waterVolumeL} L water volume, ${l.finalPressureBarGauge} bar gauge at 15 °C; valve ${l.valveOutlet}`,
      String(l.quantity),
      l.pricing ? money(l.pricing.perCylinderMinor) : '—',
      money(l.priceMinor),
    ]),
  )
  doc
    .font('bold')
    .fontSize(10)
    .text(`Total ${money(order.totalMinor)}`, left, doc.y, { width, align: 'right' })
  doc.font('body').fontSize(8).text('excluding VAT and transport', left, doc.y, { width, align: 'right' })
  doc.moveDown(1)

  // breakdown per line
  for (const l of order.lines) {
    const p = l.pricing
    if (!p) continue
    if (doc.y > doc.page.height - doc.page.margins.bottom - 140) doc.addPage()
    doc.font('bold').fontSize(10).text(`Line ${l.lineNo}: ${l.description}`, left, doc.y, { width })
    doc
      .font('body')
      .fontSize(8)
      .text(
        `Per cylinder: ${p.amountMolPerCylinder.toFixed(1)} mol, ${p.massKgPerCylinder.toFixed(2)} kg of mixture at ${p.temperatureC} °C and ` +
          `${p.pressureBarAbsolute.toFixed(2)} bar absolute (compressibility Z = ${p.compressibility.toFixed(4)}, ${modelName(p.model)}).`,
        { width },
      )
    doc.moveDown(0.3)
    const rows: string[][] = p.gases.map((g) => [
      g.formula,
      fractionText(g.fraction),
      g.massKg.toFixed(g.massKg < 0.01 ? 5 : 3),
      g.standardVolumeM3.toFixed(g.standardVolumeM3 < 0.01 ? 5 : 3),
      `${money(g.unitPriceMinor)} per ${g.unit === 'kg' ? 'kg' : 'm³'}`,
      money(g.costMinor),
    ])
    if (p.rental) rows.push([`Rental ${p.rental.key}`, '', '', '', `${p.rental.days} days at ${money(p.rental.unitPriceMinor)}`, money(p.rental.costMinor)])
    rows.push([`Certification`, '', '', '', p.certification.label, money(p.certification.costMinor)])
    for (const s of p.surcharges) rows.push(['Surcharge', '', '', '', s.label, money(s.costMinor)])
    rows.push(['Per cylinder', '', '', '', `× ${p.quantity} cylinder${p.quantity === 1 ? '' : 's'} = ${money(p.totalMinor)}`, money(p.perCylinderMinor)])
    pdfTable(
      doc,
      [
        { header: 'Item', width: 70 },
        { header: 'Fraction', width: 62, align: 'right' },
        { header: 'kg', width: 58, align: 'right' },
        { header: `m³ (${PRICE_VOLUME_REFERENCE_LABEL})`, width: 92, align: 'right' },
        { header: 'Price', width: 136 },
        { header: 'Amount', width: width - 418, align: 'right' },
      ],
      rows,
    )
    for (const note of p.notes) doc.font('body').fontSize(8).text(`Note: ${note}`, left, doc.y, { width })
    doc.moveDown(0.6)
  }

  // terms
  if (doc.y > doc.page.height - doc.page.margins.bottom - 120) doc.addPage()
  doc.font('bold').fontSize(10).text('Terms', left, doc.y, { width })
  doc.font('body').fontSize(8)
  const terms = [
    `The price includes cylinder rental for ${order.rentalDays} days from dispatch; after that, rental is charged per cylinder per day at the rates above.`,
    'Fill pressures are settled pressures in bar gauge at 15 °C; at other temperatures the gauge reading differs.',
    'The blend tolerance is the allowed deviation of the prepared content from the content asked for; the certification uncertainty is the expanded uncertainty (k = 2) of the certified value.',
    `Gas quantities are computed with the ${modelName(order.lines[0]?.pricing?.model ?? 'gerg-2008')} equation of state and are estimates for pricing; the certificate states the composition prepared.`,
  ]
  for (const t of terms) doc.text(`• ${t}`, { width })
  doc.moveDown(0.8)

  // cautions, never hidden
  const cautions = [...new Set(order.lines.flatMap((l) => l.pricing?.cautions ?? []))]
  if (cautions.length) {
    if (doc.y > doc.page.height - doc.page.margins.bottom - 100) doc.addPage()
    doc.font('bold').fontSize(10).text('Safety', left, doc.y, { width })
    doc.font('body').fontSize(8)
    for (const c of cautions) doc.text(`• ${c}`, { width })
  }
  return finish()
}

function modelName(model: string): string {
  return model === 'gerg-2008' ? 'GERG-2008' : model === 'peng-robinson' ? 'Peng–Robinson' : model === 'srk' ? 'Soave–Redlich–Kwong' : model
}

function fractionText(x: number): string {
  if (x >= 0.01) return `${(x * 100).toPrecision(4)} %`
  return `${(x * 1e6).toPrecision(4)} ppm`
}
