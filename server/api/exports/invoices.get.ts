import { reportRangeSchema } from '#shared/schemas/reports'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'office', 'admin')
  const range = await getValidatedQuery(event, validateWith(reportRangeSchema))
  const rows = await invoiceExportRows(range)
  return sendCsv(event, `invoices-${range.from}-to-${range.to}.csv`, writeCsv(INVOICE_COLUMNS, rows))
})
