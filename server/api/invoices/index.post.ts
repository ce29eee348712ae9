import { invoiceCreateSchema } from '#shared/schemas/invoices'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'office', 'admin')
  const { callId } = await readValidatedBody(event, validateWith(invoiceCreateSchema))
  const id = await draftInvoice(callId, user)
  setResponseStatus(event, 201)
  return invoiceView(id)
})
