// A purchase order as a printable PDF, in our own layout: the shop, the supplier, the order's
// number and date, its lines and total, where to deliver and the note. The same file is
// attached to the order e-mail and downloaded from the order page.
import PDFDocument from 'pdfkit'
import { FALLBACK_LOCALE, showDate } from '#shared/kerf/dates'
import { showMoney } from '#shared/kerf/money'
import type { OrderView } from './orders'

export interface OrderPdfShop {
  name: string
  /** The postal address, one line each, when the shop has given one. */
  addressLines?: readonly string[]
  /** The shop's IANA time zone: the order's date is the shop's day. */
  timeZone: string
}

// The standard PDF fonts only carry the Western European characters; anything else would
// print as garbage, so it prints as "?" instead.
const pdfText = (text: string) => text.replace(/[^\u0020-\u007e\u00a0-\u00ff\u20ac\n]/g, '?')

const INK = '#15191c'
const SOFT = '#3b4349'
const LINE = '#cfc8b8'

export function orderPdf(order: OrderView, shop: OrderPdfShop): Promise<Buffer> {
  const doc = new PDFDocument({ size: 'LETTER', margin: 54, info: { Title: `Purchase order ${order.number}`, Author: pdfText(shop.name) } })
  const chunks: Buffer[] = []
  doc.on('data', (c: Buffer) => chunks.push(c))
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)))
    doc.on('error', reject)
  })
  const left = doc.page.margins.left
  const width = doc.page.width - left - doc.page.margins.right
  const date = order.sentAt ?? order.createdAt

  // Heading: the shop on the left, the order's number and date on the right.
  doc.fillColor(INK).font('Helvetica-Bold').fontSize(18).text(pdfText(shop.name), left, 54, { width: width * 0.6 })
  doc.font('Helvetica').fontSize(10).fillColor(SOFT)
  for (const line of shop.addressLines ?? []) doc.text(pdfText(line), { width: width * 0.6 })
  doc.font('Helvetica-Bold').fontSize(16).fillColor(INK).text('Purchase order', left + width * 0.6, 54, { width: width * 0.4, align: 'right' })
  doc.font('Helvetica').fontSize(11)
    .text(`Number: ${order.number}`, { width: width * 0.4, align: 'right' })
    .text(`Date: ${showDate(date, { locale: FALLBACK_LOCALE, timeZone: shop.timeZone })}`, { width: width * 0.4, align: 'right' })

  // Supplier and delivery address side by side.
  let y = Math.max(doc.y, 130) + 16
  const half = width / 2 - 10
  doc.font('Helvetica-Bold').fontSize(10).fillColor(SOFT).text('SUPPLIER', left, y).text('DELIVER TO', left + width / 2 + 10, y)
  y += 14
  doc.font('Helvetica').fontSize(11).fillColor(INK)
  doc.text(pdfText(order.supplier?.name ?? 'No supplier chosen'), left, y, { width: half })
  if (order.supplier?.email) doc.text(pdfText(order.supplier.email), { width: half })
  const supplierEnd = doc.y
  doc.text(pdfText(shop.name), left + width / 2 + 10, y, { width: half })
  for (const line of shop.addressLines ?? []) doc.text(pdfText(line), { width: half })
  y = Math.max(supplierEnd, doc.y) + 24

  // Lines.
  const cols = [
    { title: 'Qty', width: 50, align: 'right' as const },
    { title: 'Part number', width: 110, align: 'left' as const },
    { title: 'Description', width: width - 50 - 110 - 85 - 90 - 24, align: 'left' as const },
    { title: 'Unit price', width: 85, align: 'right' as const },
    { title: 'Amount', width: 90, align: 'right' as const },
  ]
  const row = (cells: string[], bold: boolean) => {
    doc.font(bold ? 'Helvetica-Bold' : 'Helvetica').fontSize(10).fillColor(INK)
    let x = left
    let bottom = y
    cells.forEach((cell, i) => {
      const col = cols[i]!
      doc.text(pdfText(cell), x, y, { width: col.width, align: col.align })
      bottom = Math.max(bottom, doc.y)
      x += col.width + 6
    })
    y = bottom + 6
    doc.moveTo(left, y - 3).lineTo(left + width, y - 3).strokeColor(LINE).lineWidth(0.7).stroke()
    if (y > doc.page.height - 120) {
      doc.addPage()
      y = doc.page.margins.top
    }
  }
  row(cols.map((c) => c.title), true)
  for (const l of order.lines) {
    row([String(l.quantity), l.supplierPartNumber ?? '', l.typeName, showMoney(l.unitCostCents), showMoney(l.totalCents)], false)
  }
  y += 6
  doc.font('Helvetica-Bold').fontSize(12).fillColor(INK)
    .text(`Order total: ${showMoney(order.totalCents)}`, left, y, { width, align: 'right' })
  y = doc.y + 18

  if (order.note) {
    doc.font('Helvetica-Bold').fontSize(10).fillColor(SOFT).text('NOTES', left, y)
    doc.font('Helvetica').fontSize(11).fillColor(INK).text(pdfText(order.note), { width })
    y = doc.y + 18
  }
  doc.font('Helvetica').fontSize(9).fillColor(SOFT)
    .text(`Please confirm the delivery date, quoting ${order.number}.`, left, y, { width })
  doc.end()
  return done
}

export const orderPdfName = (order: { number: string }) => `purchase-order-${order.number}.pdf`
