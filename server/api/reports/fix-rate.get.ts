import { reportRangeSchema } from '#shared/schemas/reports'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'dispatcher', 'office', 'admin')
  const range = await getValidatedQuery(event, validateWith(reportRangeSchema))
  return runReport('fix-rate', range)
})
