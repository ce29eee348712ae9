// One invoice rendered to PDF through the project's own function (renderInvoicePdf: its queries
// for the business and service facts, the fonts, the lines, the marked photos), beside an empty
// PDF from the same package (pdfkit), in this process, median of N after a warm-up each.
// The invoice is the bench database's one with the most lines. Prints; asserts nothing.
import PDFDocument from 'pdfkit'
import pg from 'pg'
import { installNitroShim } from './support/nitroShim'
import { recordRow } from './support/rows'
import { median } from './support/session'

const DB = process.env.NUXT_DATABASE_URL ?? 'postgres://wayside@127.0.0.1:54329/wayside_bench'
const RUNS = Number(process.env.WAYSIDE_BENCH_RUNS ?? 15)

type Server = {
  getInvoice: (id: string) => Promise<unknown>
  renderInvoicePdf: (inv: unknown) => Promise<Buffer>
  usePool: () => pg.Pool
}
let serverPool: pg.Pool | undefined

function emptyPdf(): Promise<Buffer> {
  const doc = new PDFDocument({ size: 'LETTER' })
  const chunks: Buffer[] = []
  doc.on('data', (c: Buffer) => chunks.push(c))
  const done = new Promise<Buffer>(resolve => doc.on('end', () => resolve(Buffer.concat(chunks))))
  doc.end()
  return done
}

async function timed(n: number, work: () => Promise<Buffer>) {
  await work()
  const ms: number[] = []
  let bytes = 0
  for (let i = 0; i < n; i++) {
    const t0 = performance.now()
    bytes = (await work()).length
    ms.push(performance.now() - t0)
  }
  return { ms: median(ms), bytes }
}

const pool = new pg.Pool({ connectionString: DB, max: 1 })
try {
  const { rows: [pick] } = await pool.query(`SELECT i.id, i.number, count(l.id)::int AS lines FROM invoices i
    LEFT JOIN invoice_lines l ON l.invoice_id = i.id GROUP BY i.id ORDER BY count(l.id) DESC, i.number LIMIT 1`)
  if (!pick) throw new Error('the bench database has no invoice (the demo seed makes some)')
  const server = await installNitroShim(['db', 'pdfFonts', 'pdfPhotos', 'invoices', 'invoicePdf'],
    { databaseUrl: DB, uploadsDir: process.env.NUXT_UPLOADS_DIR ?? '.data/uploads' }) as unknown as Server
  const { getInvoice, renderInvoicePdf } = server
  serverPool = server.usePool()
  const invoice = await getInvoice(pick.id)
  const real = await timed(RUNS, () => renderInvoicePdf(invoice))
  const empty = await timed(RUNS, emptyPdf)
  console.log(`invoice W-${pick.number} (${pick.lines} lines): ${real.ms.toFixed(1)} ms, ${real.bytes} bytes; `
    + `empty PDF: ${empty.ms.toFixed(2)} ms, ${empty.bytes} bytes (medians of ${RUNS})`)
  recordRow({
    name: 'invoice-pdf', value: real.ms, unit: 'ms', floor: empty.ms, target: 'ratio ≤ 3',
    note: `renderInvoicePdf of W-${pick.number} (${pick.lines} lines, ${Math.round(real.bytes / 1024)} KB) `
      + `vs an empty pdfkit PDF, medians of ${RUNS}`,
  })
}
finally {
  await pool.end()
  await serverPool?.end()
}
