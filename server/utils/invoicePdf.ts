// The invoice as a PDF in our own layout: the business's header on every page, what a payables
// desk matches an invoice by (date of service, mechanic, unit, odometer, PO), the story, the lines
// flowing over as many pages as they need, the totals, and the photos the office marked for the
// customer. Type from pdfFonts.ts, so Ω, °C, ±, µ and accented names print as written.
import { asc, desc, eq } from 'drizzle-orm'
import PDFDocument from 'pdfkit'

type Style = PdfStyle

const PAGE = { width: 612, height: 792, left: 54, right: 558, top: 128, bottom: 60 }
const COLS = { desc: 54, qty: 336, unit: 396, amt: 478 }

/** What the PDF needs beyond the invoice itself: the business, the service facts, the marked photos. */
async function pdfFacts(inv: InvoiceDetail) {
  const db = useDb()
  const { rates, calls, users, units, clockEvents } = tables
  const [rate] = inv.ratesId
    ? await db.select().from(rates).where(eq(rates.id, inv.ratesId))
    : await db.select().from(rates).orderBy(desc(rates.effectiveFrom)).limit(1)
  const [call] = await db.select({
    mechanicId: calls.mechanicId, unitId: calls.unitId, completedAt: calls.completedAt,
    odometerReading: calls.odometerReading, engineHoursReading: calls.engineHoursReading,
  }).from(calls).where(eq(calls.id, inv.callId))
  const [mechanic] = call?.mechanicId ? await db.select({ name: users.name }).from(users).where(eq(users.id, call.mechanicId)) : []
  const [unit] = call?.unitId
    ? await db.select({ odometer: units.odometer, odometerUnit: units.odometerUnit, engineHours: units.engineHours })
        .from(units).where(eq(units.id, call.unitId))
    : []
  const clock = await db.select({ at: clockEvents.deviceAt, createdAt: clockEvents.createdAt }).from(clockEvents)
    .where(eq(clockEvents.callId, inv.callId)).orderBy(asc(clockEvents.createdAt))
  const images = await markedPhotoImages(inv.callId)
  const zone = rate?.timeZone ?? 'UTC'
  const day = (d: Date) => new Intl.DateTimeFormat('en-CA', { timeZone: zone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(d)
  const times = clock.map(c => c.at ?? c.createdAt).sort((a, b) => a.getTime() - b.getTime())
  const first = times[0] ?? call?.completedAt ?? null
  const last = call?.completedAt ?? times.at(-1) ?? null
  const serviceDate = first ? (last && day(last) !== day(first) ? `${day(first)} to ${day(last)}` : day(first)) : null
  return {
    business: {
      name: rate?.businessName || 'Road service', phone: rate?.businessPhone ?? '',
      email: rate?.businessEmail ?? '', remit: rate?.remitAddress ?? '',
    },
    serviceDate, mechanic: mechanic?.name ?? null,
    // The reading taken at the truck on this call, else the unit's last known.
    odometer: odometerShown(call, unit), engineHours: engineHoursShown(call, unit),
    images, day,
  }
}

/** The invoice as a PDF. */
export async function renderInvoicePdf(inv: InvoiceDetail): Promise<Buffer> {
  const [fonts, facts] = await Promise.all([pdfFonts(), pdfFacts(inv)])
  const doc = new PDFDocument({
    size: 'LETTER', bufferPages: true, margins: { top: PAGE.top, bottom: PAGE.bottom, left: PAGE.left, right: PAGE.width - PAGE.right },
    info: { Title: `Invoice W-${inv.number}`, Author: facts.business.name },
  })
  const chains = registerPdfFonts(doc, fonts)
  const chunks: Buffer[] = []
  doc.on('data', (c: Buffer) => chunks.push(c))
  const done = new Promise<Buffer>(resolve => doc.on('end', () => resolve(Buffer.concat(chunks))))
  const money = (c: number) => formatCents(c)
  // The face and size in use, so a page header drawn mid-paragraph can restore them.
  const current = { face: 'atkinson-400', size: 10 }
  const put = (text: string, style: Style = 'body', at?: { x: number, y: number }, opts?: PDFKit.Mixins.TextOptions) => {
    current.size = (doc as unknown as { _fontSize: number })._fontSize
    current.face = writeRuns(doc, chains, text, style, at, opts)
  }

  // The header on every page, in the top margin, so text flowing onto a new page starts below it.
  const header = () => {
    // A page break inside a paragraph lands here mid-flow: set pdfkit's paragraph aside and put it back.
    const flow = doc as unknown as { _wrapper: unknown, _textOptions: unknown }
    const saved = { wrapper: flow._wrapper, options: flow._textOptions, face: current.face, size: current.size, x: doc.x }
    flow._wrapper = null
    flow._textOptions = null
    const b = facts.business
    doc.fillColor('#000000').fontSize(16)
    put(b.name, 'bold', { x: PAGE.left, y: 36 }, { width: 300 })
    doc.fontSize(9)
    put([b.phone && `Phone ${b.phone}`, b.email].filter(Boolean).join(' · ') || ' ', 'body', { x: PAGE.left, y: 56 }, { width: 300 })
    if (b.remit) put(`Remit to: ${b.remit}`, 'body', { x: PAGE.left, y: 68 }, { width: 300 })
    doc.fontSize(14)
    put(`Invoice W-${inv.number}`, 'bold', { x: 360, y: 36 }, { width: PAGE.right - 360, align: 'right' })
    doc.fontSize(9)
    put(`${inv.customer.name} · call #${inv.call.number}`, 'body', { x: 360, y: 54 }, { width: PAGE.right - 360, align: 'right' })
    doc.moveTo(PAGE.left, 100).lineTo(PAGE.right, 100).lineWidth(0.75).stroke()
    flow._wrapper = saved.wrapper
    flow._textOptions = saved.options
    doc.font(saved.face).fontSize(saved.size)
    current.face = saved.face
    current.size = saved.size
    doc.x = saved.x
    doc.y = PAGE.top
  }
  doc.on('pageAdded', header)
  header()

  // Who, what and when: what a payables desk matches the invoice to.
  const d = (v: Date | string | null | undefined) => (v ? facts.day(new Date(v)) : '—')
  const terms = inv.customer.billingTerms === 'account' ? `account, net ${inv.customer.netDays ?? 30} days` : 'card'
  const facts2: [string, string | null][] = [
    ['Invoice date', d(inv.createdAt)], ['Due', d(inv.dueAt)], ['Terms', terms],
    ['Date of service', facts.serviceDate], ['Mechanic', facts.mechanic], ['PO', inv.call.poNumber],
    ['Unit', inv.call.unit ? [inv.call.unit.unitNumber, inv.call.unit.yearMakeModel].filter(Boolean).join(', ') : null],
    ['VIN', inv.call.unit?.vin ?? null], ['Odometer', facts.odometer], ['Engine hours', facts.engineHours],
    ['Location', inv.call.locationText],
  ]
  doc.fontSize(10)
  const billTo = `Bill to: ${inv.customer.name}${inv.customer.billingEmail ? ` <${inv.customer.billingEmail}>` : ''}`
  put(billTo, 'bold', { x: PAGE.left, y: doc.y })
  doc.moveDown(0.4)
  const top = doc.y
  facts2.forEach(([label, value], i) => {
    const x = i % 2 === 0 ? PAGE.left : 310
    const y = top + Math.floor(i / 2) * 14
    put(`${label}: `, 'bold', { x, y }, { width: 250, continued: true })
    put(value ?? '—', 'body', undefined, { width: 250 })
  })
  doc.x = PAGE.left
  doc.y = top + Math.ceil(facts2.length / 2) * 14 + 8

  // The story, as the mechanic wrote it.
  const story: [string, string | null][] = [
    ['Complaint', inv.call.storyComplaint ?? inv.call.complaint], ['Cause', inv.call.storyCause], ['Correction', inv.call.storyCorrection],
  ]
  for (const [label, text] of story) {
    if (!text) continue
    put(`${label}: `, 'bold', { x: PAGE.left, y: doc.y }, { width: PAGE.right - PAGE.left, continued: true })
    put(text, 'body', undefined, { width: PAGE.right - PAGE.left })
    doc.moveDown(0.3)
  }
  doc.moveDown(0.6)

  // The lines: a row that does not fit starts a new page, with the column headings again.
  const rowHeight = (text: string) => doc.font('atkinson-400').fontSize(10).heightOfString(text, { width: COLS.qty - COLS.desc - 8 })
  const headings = () => {
    row(['Description', 'Qty', 'Unit', 'Amount'], 'bold')
    doc.moveTo(PAGE.left, doc.y).lineTo(PAGE.right, doc.y).lineWidth(0.5).stroke()
    doc.y += 4
  }
  const row = (cells: [string, string, string, string], style: Style = 'body') => {
    const y = doc.y
    doc.fontSize(10)
    put(cells[0], style, { x: COLS.desc, y }, { width: COLS.qty - COLS.desc - 8 })
    const h = doc.y
    put(cells[1], style, { x: COLS.qty, y }, { width: 52, align: 'right' })
    put(cells[2], style, { x: COLS.unit, y }, { width: 74, align: 'right' })
    put(cells[3], style, { x: COLS.amt, y }, { width: PAGE.right - COLS.amt, align: 'right' })
    doc.y = Math.max(h, doc.y) + 4
    doc.x = PAGE.left
  }
  const room = (h: number) => {
    if (doc.y + h > PAGE.height - PAGE.bottom) {
      doc.addPage()
      return false
    }
    return true
  }
  room(60)
  headings()
  for (const l of inv.lines) {
    const text = `${l.description}${l.taxable ? '' : ' (not taxed)'}`
    if (!room(rowHeight(text) + 4)) headings()
    row([text, String(l.quantity), money(l.unitCents), money(l.amountCents)])
  }
  room(70)
  doc.moveTo(PAGE.left, doc.y).lineTo(PAGE.right, doc.y).lineWidth(0.5).stroke()
  doc.y += 4
  row(['Subtotal', '', '', money(inv.subtotalCents)])
  row([inv.customer.taxExempt ? 'Tax (customer is tax-exempt)' : 'Tax', '', '', money(inv.taxCents)])
  row(['Total', '', '', money(inv.totalCents)], 'bold')
  // Credit notes and payments since, each as it moves the balance, and what is left to pay.
  const moneyLines = invoiceMoneyLines(inv, facts.day)
  if (moneyLines.length) {
    doc.moveDown(0.6)
    // The heading stays with at least its first line.
    room(2 * rowHeight('Payments and credits') + 8)
    row(['Payments and credits', '', '', ''], 'bold')
    for (const m of moneyLines) {
      room(rowHeight(m.label) + 4)
      row([m.label, '', '', m.amountCents == null ? '' : money(m.amountCents)], m.bold ? 'bold' : 'body')
    }
  }
  doc.moveDown(1)
  doc.fillColor('#404a52').fontSize(9)
  put('Labor is billed in tenths of an hour, rounded up; time outside our normal hours is billed at the after-hours rate. '
    + 'Core charges are refunded when the old part is returned.', 'body', { x: PAGE.left, y: doc.y }, { width: PAGE.right - PAGE.left })
  doc.fillColor('#000000')

  // Photos the office marked for the customer, two to a row.
  if (facts.images.length) {
    doc.moveDown(1)
    room(230)
    doc.fontSize(12)
    put('Photos', 'bold', { x: PAGE.left, y: doc.y })
    doc.moveDown(0.3)
    const w = 240, h = 180
    for (let i = 0; i < facts.images.length; i += 2) {
      room(h + 30)
      const y = doc.y
      for (const [j, img] of facts.images.slice(i, i + 2).entries()) {
        const x = PAGE.left + j * (w + 24)
        try {
          doc.image(img.bytes, x, y, { fit: [w, h] })
        }
        catch {
          doc.rect(x, y, w, h).stroke()
        }
        doc.fontSize(9)
        put(img.caption ?? '', 'body', { x, y: y + h + 4 }, { width: w })
      }
      doc.x = PAGE.left
      doc.y = y + h + 24
    }
  }

  // Page numbers, written once the page count is known; the bottom margin is lifted so they do not start a page.
  const range = doc.bufferedPageRange()
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i)
    const bottom = doc.page.margins.bottom
    doc.page.margins.bottom = 0
    doc.fontSize(8).fillColor('#404a52')
    const text = `Invoice W-${inv.number} · page ${i - range.start + 1} of ${range.count}`
    put(text, 'body', { x: PAGE.left, y: PAGE.height - 40 }, { width: PAGE.right - PAGE.left, align: 'right' })
    doc.page.margins.bottom = bottom
  }
  doc.end()
  return done
}
