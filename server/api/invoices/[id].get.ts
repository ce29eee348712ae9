import { idParamsSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const invoice = await invoiceView(id)
  if (!invoice) throw createError({ status: 404, statusText: 'No such invoice' })
  return invoice
})
