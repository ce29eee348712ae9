import { reportParamsSchema, reportRangeSchema } from '#shared/schemas/reports'

// One report's rows over a range of local days; what each column is, is in shared/utils/reportLabels.ts.
export default defineEventHandler(async (event) => {
  await requireRole(event, 'dispatcher', 'office', 'admin')
  const { name } = await getValidatedRouterParams(event, validateWith(reportParamsSchema))
  const range = await getValidatedQuery(event, validateWith(reportRangeSchema))
  return runReport(name, range)
})
