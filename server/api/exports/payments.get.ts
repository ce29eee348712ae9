import { reportRangeSchema } from '#shared/schemas/reports'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'office', 'admin')
  const range = await getValidatedQuery(event, validateWith(reportRangeSchema))
  const rows = await paymentExportRows(range)
  return sendCsv(event, `payments-${range.from}-to-${range.to}.csv`, writeCsv(PAYMENT_COLUMNS, rows))
})
