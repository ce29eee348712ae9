import { invoiceListQuerySchema } from '#shared/schemas/invoices'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'office', 'admin')
  const query = await getValidatedQuery(event, validateWith(invoiceListQuerySchema))
  return listInvoices(query)
})
