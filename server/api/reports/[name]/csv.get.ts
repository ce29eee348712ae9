import { reportParamsSchema, reportRangeSchema } from '#shared/schemas/reports'

// One report as CSV: the headings and words people read on the page, formula-like cells neutralised.
export default defineEventHandler(async (event) => {
  await requireRole(event, 'dispatcher', 'office', 'admin')
  const { name } = await getValidatedRouterParams(event, validateWith(reportParamsSchema))
  const range = await getValidatedQuery(event, validateWith(reportRangeSchema))
  const report = await runReport(name, range)
  return sendCsv(event, `${name}-${report.from}-to-${report.to}.csv`, writeCsv(reportCsvColumns(name), report.rows))
})
