// The service report as a PDF in our own layout: the business and the call on every page, then the
// story, the fault codes with their meanings, the readings with spec and verdict, the test runs'
// conclusions, the checks after the repair, the marked photos and the driver's drawn sign-off.
// No prices. Type from pdfFonts.ts, so Ω, °C and ± print as written.
import PDFDocument from 'pdfkit'

const PAGE = { width: 612, height: 792, left: 54, right: 558, top: 112, bottom: 60 }
const WIDTH = PAGE.right - PAGE.left

/** The paths of a drawn signature kept as SVG (pdfkit has no SVG): viewBox and each path's `d`. */
function svgSignature(dataUrl: string) {
  const svg = Buffer.from(dataUrl.split(',')[1] ?? '', 'base64').toString('utf8')
  const box = /viewBox="([\d.\s-]+)"/.exec(svg)?.[1]?.trim().split(/\s+/).map(Number)
  const paths = [...svg.matchAll(/<path[^>]*\sd="([^"]+)"/g)].map(m => m[1]!)
  return box?.length === 4 && paths.length ? { box: box as [number, number, number, number], paths } : null
}

export async function renderServiceReportPdf(r: ServiceReportFacts): Promise<Buffer> {
  const fonts = await pdfFonts()
  const doc = new PDFDocument({
    size: 'LETTER', bufferPages: true, margins: { top: PAGE.top, bottom: PAGE.bottom, left: PAGE.left, right: PAGE.width - PAGE.right },
    info: { Title: `Service report, road call #${r.number}`, Author: r.business },
  })
  const chains = registerPdfFonts(doc, fonts)
  const chunks: Buffer[] = []
  doc.on('data', (c: Buffer) => chunks.push(c))
  const done = new Promise<Buffer>(resolve => doc.on('end', () => resolve(Buffer.concat(chunks))))
  const put = (text: string, style: PdfStyle = 'body', at?: { x: number, y: number }, opts?: PDFKit.Mixins.TextOptions) =>
    writeRuns(doc, chains, text, style, at, opts)
  const room = (h: number) => {
    if (doc.y + h > PAGE.height - PAGE.bottom) doc.addPage()
  }
  const heading = (text: string) => {
    room(60)
    doc.moveDown(0.8).fontSize(13).fillColor('#000000')
    put(text, 'bold', { x: PAGE.left, y: doc.y }, { width: WIDTH })
    doc.moveTo(PAGE.left, doc.y + 1).lineTo(PAGE.right, doc.y + 1).lineWidth(0.5).stroke()
    doc.moveDown(0.4).fontSize(10)
  }
  const labelled = (label: string, text: string | null | undefined) => {
    if (!text) return
    room(28)
    put(`${label}: `, 'bold', { x: PAGE.left, y: doc.y }, { width: WIDTH, continued: true })
    put(text, 'body', undefined, { width: WIDTH })
    doc.moveDown(0.2)
  }

  // The business and the call at the top of every page; pages start below it.
  const header = () => {
    // A page break inside a paragraph lands here mid-flow: set pdfkit's paragraph aside and put it back.
    const flow = doc as unknown as { _wrapper: unknown, _textOptions: unknown, _font: { name?: string } | null, _fontSize: number }
    const saved = { wrapper: flow._wrapper, options: flow._textOptions, font: flow._font, size: flow._fontSize, color: '#000000' }
    flow._wrapper = null
    flow._textOptions = null
    doc.fontSize(16).fillColor('#000000')
    put(r.business, 'bold', { x: PAGE.left, y: 36 }, { width: 300 })
    doc.fontSize(14)
    put('Service report', 'bold', { x: 360, y: 36 }, { width: PAGE.right - 360, align: 'right' })
    doc.fontSize(9)
    put(`${r.customer} · road call #${r.number}`, 'body', { x: 360, y: 56 }, { width: PAGE.right - 360, align: 'right' })
    doc.moveTo(PAGE.left, 84).lineTo(PAGE.right, 84).lineWidth(0.75).stroke()
    flow._wrapper = saved.wrapper
    flow._textOptions = saved.options
    flow._font = saved.font
    doc.fontSize(saved.size)
    doc.x = PAGE.left
    doc.y = PAGE.top
  }
  doc.on('pageAdded', header)
  header()
  doc.fontSize(10)

  const unit = r.unit ? [r.unit.number, r.unit.description].filter(Boolean).join(', ') : null
  const facts: [string, string | null][] = [
    ['Unit', unit], ['VIN', r.unit?.vin ?? null], ['Odometer', r.unit?.odometer ?? null], ['Engine hours', r.unit?.engineHours ?? null],
    ['Date of service', r.serviceDate], ['Mechanic', r.mechanic], ['Where', r.location], ['Outcome', r.outcome],
    ['Finished', r.completedOn],
  ]
  const top = doc.y
  facts.forEach(([label, value], i) => {
    put(`${label}: `, 'bold', { x: i % 2 ? 310 : PAGE.left, y: top + Math.floor(i / 2) * 14 }, { width: 240, continued: true })
    put(value ?? '—', 'body', undefined, { width: 240 })
  })
  doc.x = PAGE.left
  doc.y = top + Math.ceil(facts.length / 2) * 14

  heading('What was reported, found and done')
  labelled('Complaint', r.story.complaint)
  labelled('Cause', r.story.cause)
  labelled('Correction', r.story.correction)
  labelled('Follow-up', r.followUp)

  if (r.faultCodes.length) {
    heading('Fault codes')
    for (const f of r.faultCodes) {
      room(16)
      put(`${f.code}${f.state === 'cleared' ? ' (cleared)' : f.state === 'stored' ? ' (stored)' : ''}: `, 'bold',
        { x: PAGE.left, y: doc.y }, { width: WIDTH, continued: true })
      put(f.meaning ?? 'meaning not in our table; see the maker\'s service data', 'body', undefined, { width: WIDTH })
    }
  }

  if (r.readings.length) {
    heading('Readings')
    for (const m of r.readings) {
      room(30)
      const verdict = m.verdict ? ` — ${m.verdict}` : ''
      put(`${m.label}: ${m.value}${verdict}`, 'bold', { x: PAGE.left, y: doc.y }, { width: WIDTH })
      const detail = [m.where, m.conditions, m.spec && `spec ${m.spec}`, m.specNote].filter(Boolean).join(' · ')
      if (detail) put(detail, 'body', { x: PAGE.left + 12, y: doc.y }, { width: WIDTH - 12 })
      doc.moveDown(0.2)
    }
  }

  if (r.tests.length) {
    heading('Guided tests')
    for (const t of r.tests) labelled(t.title, t.conclusion)
  }

  if (r.verification) {
    heading('Checked after the repair')
    for (const c of r.verification.checks) {
      room(14)
      put(`${c.done ? 'Yes' : 'Not recorded'}: ${c.label}`, 'body', { x: PAGE.left, y: doc.y }, { width: WIDTH })
    }
    labelled('Test drive', r.verification.testDrive)
    labelled('Live values', r.verification.liveValuesNote)
    labelled('Result', r.verification.passed ? 'Repair verified' : 'Not verified')
  }

  if (r.images.length) {
    heading('Photos')
    const w = 240, h = 180
    for (let i = 0; i < r.images.length; i += 2) {
      room(h + 30)
      const y = doc.y
      for (const [j, img] of r.images.slice(i, i + 2).entries()) {
        const x = PAGE.left + j * (w + 24)
        try {
          doc.image(img.bytes, x, y, { fit: [w, h] })
        }
        catch {
          doc.rect(x, y, w, h).stroke()
        }
        doc.fontSize(9)
        put(img.caption ?? '', 'body', { x, y: y + h + 4 }, { width: w })
        doc.fontSize(10)
      }
      doc.x = PAGE.left
      doc.y = y + h + 24
    }
  }

  heading('Driver\'s sign-off')
  if (!r.signOff) put('Not signed.', 'body', { x: PAGE.left, y: doc.y })
  else {
    room(110)
    put(`Signed by ${r.signOff.driverName} on ${r.signOff.at}`, 'body', { x: PAGE.left, y: doc.y }, { width: WIDTH })
    const y = doc.y + 4
    const sig = r.signOff.signature
    const svg = sig.startsWith('data:image/svg+xml') ? svgSignature(sig) : null
    if (svg) {
      const [bx, by, bw, bh] = svg.box
      const scale = Math.min(240 / bw, 80 / bh)
      doc.save().translate(PAGE.left - bx * scale, y - by * scale).scale(scale)
      for (const d of svg.paths) doc.path(d).lineWidth(2 / scale).strokeColor('#000000').stroke()
      doc.restore()
    }
    else if (/^data:image\/(png|jpeg);base64,/.test(sig)) {
      try {
        doc.image(Buffer.from(sig.split(',')[1]!, 'base64'), PAGE.left, y, { fit: [240, 80] })
      }
      catch {
        put('(the drawn signature is kept on the record)', 'body', { x: PAGE.left, y })
      }
    }
    else put('(the drawn signature is kept on the record)', 'body', { x: PAGE.left, y })
    doc.rect(PAGE.left, y, 240, 80).lineWidth(0.5).strokeColor('#808890').stroke().strokeColor('#000000')
    doc.x = PAGE.left
    doc.y = y + 88
  }

  const range = doc.bufferedPageRange()
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i)
    const bottom = doc.page.margins.bottom
    doc.page.margins.bottom = 0
    doc.fontSize(8).fillColor('#404a52')
    put(`Service report, road call #${r.number} · page ${i - range.start + 1} of ${range.count}`, 'body',
      { x: PAGE.left, y: PAGE.height - 40 }, { width: WIDTH, align: 'right' })
    doc.page.margins.bottom = bottom
  }
  doc.end()
  return done
}
