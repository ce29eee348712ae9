import { idParamsSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const invoice = await getInvoice(id)
  if (!invoice) throw createError({ status: 404, statusText: 'No such invoice' })
  const pdf = await renderInvoicePdf(invoice)
  setResponseHeaders(event, {
    'content-type': 'application/pdf',
    'content-disposition': `inline; filename="invoice-W-${invoice.number}.pdf"`,
    'cache-control': 'private, no-store',
  })
  return pdf
})
