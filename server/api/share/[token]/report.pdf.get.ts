// The service report through the fleet's status link, once the work is done; the same 404 otherwise.
export default defineEventHandler(async (event) => {
  const { call } = await callOfStatusLink(getRouterParam(event, 'token'))
  if (!isDoneStatus(call.status)) linkNotFound()
  const facts = await serviceReportFacts(call.id)
  if (!facts) linkNotFound()
  const pdf = await renderServiceReportPdf(facts)
  setResponseHeaders(event, {
    'content-type': 'application/pdf',
    'content-disposition': `inline; filename="${serviceReportFilename(facts)}"`,
    'cache-control': 'no-store', 'referrer-policy': 'no-referrer', 'x-robots-tag': 'noindex',
  })
  return pdf
})
