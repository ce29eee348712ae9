import { idParamsSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'dispatcher', 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const { call } = await requireCallAccess(event, id)
  const facts = await serviceReportFacts(call.id)
  if (!facts) throw createError({ status: 404, statusText: 'Call not found' })
  const pdf = await renderServiceReportPdf(facts)
  setResponseHeaders(event, {
    'content-type': 'application/pdf',
    'content-disposition': `inline; filename="${serviceReportFilename(facts)}"`,
    'cache-control': 'private, no-store',
  })
  return pdf
})
