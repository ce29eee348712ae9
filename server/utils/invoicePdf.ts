import PDFDocument from 'pdfkit'

async function font(name: string): Promise<Buffer | undefined> {
  const raw = await useStorage('assets:server').getItemRaw(`fonts/${name}`)
  return raw ? Buffer.from(raw as Uint8Array) : undefined
}

/** The invoice as a PDF in our own simple layout, set in Atkinson Hyperlegible. */
export async function renderInvoicePdf(inv: InvoiceDetail): Promise<Buffer> {
  const [regular, bold] = await Promise.all([font('atkinson-400.woff'), font('atkinson-700.woff')])
  const doc = new PDFDocument({ size: 'LETTER', margin: 54, info: { Title: `Invoice W-${inv.number}`, Author: 'Two Rivers Road Service' } })
  if (regular) doc.registerFont('body', regular)
  if (bold) doc.registerFont('bold', bold)
  const body = regular ? 'body' : 'Helvetica', strong = bold ? 'bold' : 'Helvetica-Bold'
  const chunks: Buffer[] = []
  doc.on('data', (c: Buffer) => chunks.push(c))
  const done = new Promise<Buffer>(resolve => doc.on('end', () => resolve(Buffer.concat(chunks))))
  const money = (c: number) => formatCents(c)
  const d = (v: Date | string | null | undefined) => (v ? new Date(v).toISOString().slice(0, 10) : '—')

  doc.font(strong).fontSize(20).text('Two Rivers Road Service')
  doc.font(body).fontSize(10).text('14 Quarry Spur, Harrow Bend · road calls day and night')
  doc.moveDown()
  doc.font(strong).fontSize(16).text(`Invoice W-${inv.number}`)
  doc.font(body).fontSize(10)
    .text(`Date ${d(inv.createdAt)}   Due ${d(inv.dueAt)}   Terms ${inv.customer.billingTerms === 'account' ? `account, net ${inv.customer.netDays ?? 30} days` : 'card'}`)
    .moveDown(0.5)
    .text(`Bill to: ${inv.customer.name}${inv.customer.billingEmail ? ` <${inv.customer.billingEmail}>` : ''}`)
    .text(`Call #${inv.call.number}${inv.call.poNumber ? `, PO ${inv.call.poNumber}` : ''}: ${inv.call.locationText}`)
  if (inv.call.unit) doc.text(`Unit ${inv.call.unit.unitNumber}${inv.call.unit.vin ? `, VIN ${inv.call.unit.vin}` : ''}${inv.call.unit.yearMakeModel ? `, ${inv.call.unit.yearMakeModel}` : ''}`)
  doc.moveDown()
  for (const [label, text] of [['Complaint', inv.call.storyComplaint ?? inv.call.complaint], ['Cause', inv.call.storyCause], ['Correction', inv.call.storyCorrection]] as const) {
    if (text) doc.font(strong).text(`${label}: `, { continued: true }).font(body).text(text)
  }
  doc.moveDown()

  const x = { desc: 54, qty: 340, unit: 400, amt: 480 }
  const row = (cells: [string, string, string, string], f = body) => {
    const y = doc.y
    doc.font(f).fontSize(10)
    doc.text(cells[0], x.desc, y, { width: 280 })
    const h = doc.y
    doc.text(cells[1], x.qty, y, { width: 55, align: 'right' })
    doc.text(cells[2], x.unit, y, { width: 75, align: 'right' })
    doc.text(cells[3], x.amt, y, { width: 78, align: 'right' })
    doc.y = Math.max(h, doc.y) + 4
    doc.x = x.desc
  }
  row(['Description', 'Qty', 'Unit', 'Amount'], strong)
  doc.moveTo(54, doc.y).lineTo(558, doc.y).stroke()
  doc.moveDown(0.3)
  for (const l of inv.lines) row([`${l.description}${l.taxable ? '' : ' (not taxed)'}`, String(l.quantity), money(l.unitCents), money(l.amountCents)])
  doc.moveTo(54, doc.y).lineTo(558, doc.y).stroke()
  doc.moveDown(0.3)
  row(['Subtotal', '', '', money(inv.subtotalCents)])
  row([inv.customer.taxExempt ? 'Tax (customer is tax-exempt)' : 'Tax', '', '', money(inv.taxCents)])
  row(['Total', '', '', money(inv.totalCents)], strong)
  doc.moveDown(2)
  doc.font(body).fontSize(9).fillColor('#404a52')
    .text('Labor is billed in tenths of an hour, rounded up. Travel is billed out and back from our yard. Core charges are refunded when the old part is returned.')
  doc.end()
  return done
}
