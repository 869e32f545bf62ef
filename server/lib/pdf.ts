import { createRequire } from 'node:module'
import PDFDocument from 'pdfkit'
import { DEMO_SHOP } from '../seed/demo.ts'

const require = createRequire(import.meta.url)
/** Inter, shipped with the app (no font CDN): the same face on screen and on paper. */
const INTER_REGULAR = require.resolve('@fontsource/inter/files/inter-latin-400-normal.woff')
const INTER_BOLD = require.resolve('@fontsource/inter/files/inter-latin-700-normal.woff')

export interface PdfFrame {
  /** document title printed in the header, e.g. "Certificate of composition" */
  title: string
  /** identification printed on every page, e.g. { Order: 'FW-2026-0042', Cylinder: 'KR-S50-1001' } */
  ids: Record<string, string>
  /** 'A4' (default) or 'LETTER' */
  size?: 'A4' | 'LETTER'
}

/**
 * A black-and-white document frame shared by quotes, fill sheets, labels and certificates: shop header,
 * and on every page a footer with the identification and "page n of m". Call `finish()` for the bytes.
 */
export function createPdf(frame: PdfFrame) {
  const doc = new PDFDocument({
    size: frame.size ?? 'A4',
    margins: { top: 72, bottom: 64, left: 56, right: 56 },
    bufferPages: true,
    info: { Title: frame.title, Producer: 'Fillwright' },
  })
  doc.registerFont('body', INTER_REGULAR)
  doc.registerFont('bold', INTER_BOLD)
  doc.font('body').fontSize(10)
  const chunks: Buffer[] = []
  doc.on('data', (c: Buffer) => chunks.push(c))
  const done = new Promise<Buffer>((resolve) => doc.on('end', () => resolve(Buffer.concat(chunks))))

  const header = () => {
    const { left, right, top } = doc.page.margins
    const width = doc.page.width - left - right
    doc.save()
    doc
      .font('bold')
      .fontSize(9)
      .text(DEMO_SHOP.name, left, top - 44, { width: width / 2, lineBreak: false })
    doc
      .font('body')
      .fontSize(8)
      .text(`${DEMO_SHOP.address} · ${DEMO_SHOP.phone}`, left, top - 32, { width: width / 2 + 60, lineBreak: false })
    doc
      .font('bold')
      .fontSize(11)
      .text(frame.title, left + width / 2, top - 44, { width: width / 2, align: 'right', lineBreak: false })
    doc
      .moveTo(left, top - 16)
      .lineTo(left + width, top - 16)
      .lineWidth(0.5)
      .stroke('#000')
    doc.restore()
    doc.font('body').fontSize(10).fillColor('#000')
    doc.x = left
    doc.y = top
  }
  header()
  doc.on('pageAdded', header)

  return {
    doc,
    async finish(): Promise<Buffer> {
      const range = doc.bufferedPageRange()
      const idText = Object.entries(frame.ids)
        .map(([k, v]) => `${k}: ${v}`)
        .join('   ')
      for (let i = range.start; i < range.start + range.count; i++) {
        doc.switchToPage(i)
        const { left, right, bottom } = doc.page.margins
        const width = doc.page.width - left - right
        const y = doc.page.height - bottom + 20
        // writing inside the bottom margin must not trigger a new page
        const saved = doc.page.margins.bottom
        doc.page.margins.bottom = 0
        doc.font('body').fontSize(8).fillColor('#000')
        doc.text(idText, left, y, { width: width * 0.75, lineBreak: false })
        doc.text(`Page ${i - range.start + 1} of ${range.count}`, left + width * 0.75, y, { width: width * 0.25, align: 'right', lineBreak: false })
        doc.page.margins.bottom = saved
      }
      doc.end()
      return done
    },
  }
}

/** A simple ruled table that breaks across pages and repeats its header row. */
export function pdfTable(doc: PDFKit.PDFDocument, columns: { header: string; width: number; align?: 'left' | 'right' | 'center' }[], rows: string[][]): void {
  const left = doc.page.margins.left
  const drawRow = (cells: string[], bold: boolean) => {
    const heights = cells.map((c, i) =>
      doc
        .font(bold ? 'bold' : 'body')
        .fontSize(9)
        .heightOfString(c, { width: columns[i].width - 6 }),
    )
    const h = Math.max(...heights) + 6
    if (doc.y + h > doc.page.height - doc.page.margins.bottom) {
      doc.addPage()
      if (!bold)
        drawRow(
          columns.map((c) => c.header),
          true,
        )
    }
    const y = doc.y
    let x = left
    cells.forEach((c, i) => {
      doc
        .font(bold ? 'bold' : 'body')
        .fontSize(9)
        .text(c, x + 3, y + 3, { width: columns[i].width - 6, align: columns[i].align ?? 'left' })
      x += columns[i].width
    })
    doc
      .moveTo(left, y + h)
      .lineTo(x, y + h)
      .lineWidth(bold ? 0.8 : 0.3)
      .stroke('#000')
    doc.x = left
    doc.y = y + h
  }
  drawRow(
    columns.map((c) => c.header),
    true,
  )
  for (const r of rows) drawRow(r, false)
  doc.moveDown(0.5)
}
