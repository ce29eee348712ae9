import { invoiceAdjustmentSchema } from '#shared/schemas/invoices'
import { idParamsSchema } from '#shared/schemas/users'

// The office adds, changes or removes a line of a draft, with a reason; answers the repriced invoice.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const input = await readValidatedBody(event, validateWith(invoiceAdjustmentSchema))
  await adjustDraft(id, input, user)
  return invoiceView(id)
})
