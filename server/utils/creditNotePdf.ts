import PDFDocument from 'pdfkit'

/** A credit note as a PDF: which invoice it corrects, why, its negative lines and totals. */
export async function renderCreditNotePdf(note: CreditNoteDetail): Promise<Buffer> {
  const fonts = useStorage('assets:server')
  const [regular, bold] = await Promise.all(['atkinson-400.woff', 'atkinson-700.woff'].map(async (f) => {
    const raw = await fonts.getItemRaw(`fonts/${f}`)
    return raw ? Buffer.from(raw as Uint8Array) : undefined
  }))
  const doc = new PDFDocument({ size: 'LETTER', margin: 54, info: { Title: `Credit note CN-${note.number}`,
    Author: 'Two Rivers Road Service' } })
  if (regular) doc.registerFont('body', regular)
  if (bold) doc.registerFont('bold', bold)
  const body = regular ? 'body' : 'Helvetica'
  const strong = bold ? 'bold' : 'Helvetica-Bold'
  const chunks: Buffer[] = []
  doc.on('data', (c: Buffer) => chunks.push(c))
  const done = new Promise<Buffer>(resolve => doc.on('end', () => resolve(Buffer.concat(chunks))))
  const day = (v: Date | string) => new Date(v).toISOString().slice(0, 10)

  doc.font(strong).fontSize(20).text('Two Rivers Road Service')
  doc.font(body).fontSize(10).text('14 Quarry Spur, Harrow Bend · road calls day and night').moveDown()
  doc.font(strong).fontSize(16).text(`Credit note CN-${note.number}`)
  doc.font(body).fontSize(10)
    .text(`Date ${day(note.createdAt)}`)
    .text(`Corrects invoice W-${note.invoice.number} of ${day(note.invoice.createdAt)} (${formatCents(note.invoice.totalCents)})`)
    .text(`To: ${note.customer.name}, road call #${note.invoice.callNumber}${note.invoice.poNumber ? `, PO ${note.invoice.poNumber}` : ''}`)
    .moveDown(0.5)
  doc.font(strong).text('Reason: ', { continued: true }).font(body).text(note.reason).moveDown()
  const row = (label: string, amount: string, f = body) => {
    const y = doc.y
    doc.font(f).fontSize(10).text(label, 54, y, { width: 400 })
    const h = doc.y
    doc.text(amount, 458, y, { width: 100, align: 'right' })
    doc.y = Math.max(h, doc.y) + 4
    doc.x = 54
  }
  row('Description', 'Amount', strong)
  doc.moveTo(54, doc.y).lineTo(558, doc.y).stroke().moveDown(0.3)
  for (const l of note.lines) row(`${l.description}${l.taxable ? '' : ' (not taxed)'}`, formatCents(l.amountCents))
  doc.moveTo(54, doc.y).lineTo(558, doc.y).stroke().moveDown(0.3)
  row('Subtotal', formatCents(note.subtotalCents))
  row('Tax', formatCents(note.taxCents))
  row('Total credited', formatCents(note.totalCents), strong)
  doc.end()
  return done
}
