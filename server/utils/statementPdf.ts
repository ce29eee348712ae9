// A customer's statement of account as a PDF in our own layout: the business and the customer on
// every page, the balance by days past due, each open invoice with what was paid and credited
// against it, then the money received lately. Type from pdfFonts.ts, so any name prints as written.
import PDFDocument from 'pdfkit'
import { PAYMENT_METHOD_WORDS } from '#shared/schemas/payments'

const PAGE = { width: 612, height: 792, left: 54, right: 558, top: 128, bottom: 60 }
type Cell = { text: string, width: number, align?: 'left' | 'right' }

export async function renderStatementPdf(s: CustomerStatement): Promise<Buffer> {
  const fonts = await pdfFonts()
  const title = `Statement for ${s.customer.name} as of ${s.asOf}`
  const doc = new PDFDocument({
    size: 'LETTER', bufferPages: true, margins: { top: PAGE.top, bottom: PAGE.bottom, left: PAGE.left, right: PAGE.width - PAGE.right },
    info: { Title: title, Author: s.business.name },
  })
  const chains = registerPdfFonts(doc, fonts)
  const chunks: Buffer[] = []
  doc.on('data', (c: Buffer) => chunks.push(c))
  const done = new Promise<Buffer>(resolve => doc.on('end', () => resolve(Buffer.concat(chunks))))
  const put = (text: string, style: PdfStyle, at?: { x: number, y: number }, opts?: PDFKit.Mixins.TextOptions) =>
    writeRuns(doc, chains, text, style, at, opts)
  const width = PAGE.right - PAGE.left

  // The header on every page, in the top margin; rows are drawn at fixed places, so no paragraph is cut.
  const header = () => {
    const b = s.business
    doc.fillColor('#000000').fontSize(16)
    put(b.name, 'bold', { x: PAGE.left, y: 36 }, { width: 300 })
    doc.fontSize(9)
    put([b.phone && `Phone ${b.phone}`, b.email].filter(Boolean).join(' · ') || ' ', 'body', { x: PAGE.left, y: 56 }, { width: 300 })
    if (b.remit) put(`Remit to: ${b.remit}`, 'body', { x: PAGE.left, y: 68 }, { width: 300 })
    doc.fontSize(14)
    put('Statement of account', 'bold', { x: 340, y: 36 }, { width: PAGE.right - 340, align: 'right' })
    doc.fontSize(9)
    put(s.customer.name, 'body', { x: 340, y: 54 }, { width: PAGE.right - 340, align: 'right' })
    put(`As of ${s.asOf}`, 'body', { x: 340, y: 66 }, { width: PAGE.right - 340, align: 'right' })
    doc.moveTo(PAGE.left, 100).lineTo(PAGE.right, 100).lineWidth(0.75).stroke()
    doc.x = PAGE.left
    doc.y = PAGE.top
  }
  doc.on('pageAdded', header)
  header()

  const row = (cells: Cell[], style: PdfStyle = 'body', size = 9) => {
    doc.fontSize(size)
    doc.font(style === 'bold' ? 'atkinson-700' : 'atkinson-400')
    const heights = cells.map(c => doc.heightOfString(c.text || ' ', { width: c.width - 6 }))
    if (doc.y + Math.max(...heights) + 4 > PAGE.height - PAGE.bottom) doc.addPage()
    const y = doc.y
    let x = PAGE.left
    let bottom = y
    for (const c of cells) {
      put(c.text || ' ', style, { x, y }, { width: c.width - 6, align: c.align ?? 'left' })
      bottom = Math.max(bottom, doc.y)
      x += c.width
    }
    doc.x = PAGE.left
    doc.y = bottom + 4
  }
  const rule = () => {
    doc.moveTo(PAGE.left, doc.y).lineTo(PAGE.right, doc.y).lineWidth(0.5).stroke()
    doc.y += 4
  }
  const heading = (text: string) => {
    if (doc.y + 60 > PAGE.height - PAGE.bottom) doc.addPage()
    doc.moveDown(0.8)
    doc.fontSize(12)
    put(text, 'bold', { x: PAGE.left, y: doc.y }, { width })
    doc.moveDown(0.3)
  }
  const money = (c: number) => formatCents(c)

  // To whom, on what terms.
  doc.fontSize(10)
  const to = `To: ${s.customer.name}${s.customer.billingEmail ? ` <${s.customer.billingEmail}>` : ''}`
  put(to, 'bold', { x: PAGE.left, y: doc.y }, { width })
  const terms = s.customer.billingTerms === 'account' ? `On account, net ${s.customer.netDays ?? 30} days` : 'Card on completion'
  put(`Terms: ${terms}`, 'body', undefined, { width })

  // What is owed, by days past due: the same buckets as the office's fleet accounts.
  heading('Balance by days past due')
  const a = s.aging
  const bucket = (text: string) => ({ text, width: width / 6, align: 'right' as const })
  row(['Not yet due', '1–30 days late', '31–60 days', '61–90 days', 'Over 90 days', 'Owed in all'].map(bucket), 'bold')
  rule()
  row([a.currentCents, a.d1to30Cents, a.d31to60Cents, a.d61to90Cents, a.d90PlusCents, a.totalCents].map(c => bucket(money(c))))

  // Each open invoice.
  heading('Open invoices')
  const invCols = (v: string[]): Cell[] => [
    { text: v[0]!, width: 50 }, { text: v[1]!, width: 40 }, { text: v[2]!, width: 64 }, { text: v[3]!, width: 56 },
    { text: v[4]!, width: 56 }, { text: v[5]!, width: 46, align: 'right' }, { text: v[6]!, width: 62, align: 'right' },
    { text: v[7]!, width: 66, align: 'right' }, { text: v[8]!, width: 64, align: 'right' },
  ]
  row(invCols(['Invoice', 'Call', 'PO', 'Issued', 'Due', 'Days late', 'Total', 'Paid, credited', 'Balance']), 'bold', 8)
  rule()
  if (!s.invoices.length) row([{ text: 'No open invoices.', width }])
  for (const i of s.invoices) {
    row(invCols([`W-${i.number}`, `#${i.callNumber}`, i.po ?? '—', i.issuedOn, i.dueOn, i.daysLate > 0 ? String(i.daysLate) : '—',
      money(i.totalCents), money(i.paidCents + i.creditedCents), money(i.balanceCents)]))
  }
  rule()
  row([{ text: 'Balance owed', width: width - 64 }, { text: money(a.totalCents), width: 64, align: 'right' }], 'bold', 10)

  // Money received (and given back) lately.
  heading(`Payments received since ${s.since}`)
  const payCols = (v: string[]): Cell[] => [
    { text: v[0]!, width: 70 }, { text: v[1]!, width: 64 }, { text: v[2]!, width: 150 }, { text: v[3]!, width: 150 },
    { text: v[4]!, width: 70, align: 'right' },
  ]
  row(payCols(['Date', 'Invoice', 'How', 'Reference', 'Amount']), 'bold', 8)
  rule()
  if (!s.payments.length) row([{ text: 'No payments in this period.', width }])
  for (const p of s.payments) {
    const how = PAYMENT_METHOD_WORDS[p.method as keyof typeof PAYMENT_METHOD_WORDS] ?? p.method
    row(payCols([p.receivedOn, `W-${p.invoiceNumber}`, p.amountCents < 0 ? `Refund (${how})` : how, p.reference ?? '—',
      money(p.amountCents)]))
  }

  doc.moveDown(1)
  doc.fillColor('#404a52').fontSize(9)
  put('Please quote the invoice numbers with your payment. A payment made in the last few days may not show yet.',
    'body', { x: PAGE.left, y: doc.y }, { width })
  doc.fillColor('#000000')

  // Page numbers once the count is known; the bottom margin is lifted so they do not start a page.
  const range = doc.bufferedPageRange()
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i)
    const bottom = doc.page.margins.bottom
    doc.page.margins.bottom = 0
    doc.fontSize(8).fillColor('#404a52')
    const text = `${title} · page ${i - range.start + 1} of ${range.count}`
    put(text, 'body', { x: PAGE.left, y: PAGE.height - 40 }, { width, align: 'right' })
    doc.page.margins.bottom = bottom
  }
  doc.end()
  return done
}
