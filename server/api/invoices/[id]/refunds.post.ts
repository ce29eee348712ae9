import { refundSchema } from '#shared/schemas/payments'
import { idParamsSchema } from '#shared/schemas/users'

// Gives money back on one payment of the invoice, once per intent (Idempotency-Key).
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const input = await readValidatedBody(event, validateWith(refundSchema))
  const key = readIdempotencyKey(event, input.idempotencyKey)
  const refund = await refundPayment(id, input, key, user)
  return { ...(await getInvoice(id))!, refund }
})
