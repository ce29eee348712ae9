import { paymentRecordSchema } from '#shared/schemas/payments'
import { idParamsSchema } from '#shared/schemas/users'

// The office takes money on an invoice, once per intent: the Idempotency-Key header (or the body's
// idempotencyKey) names the intent; a repeat answers with the same payment, a second intent on a
// settled invoice gets 409 saying what settled it. Cards are never taken here (the payment page).
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const input = await readValidatedBody(event, validateWith(paymentRecordSchema))
  const key = readIdempotencyKey(event, input.idempotencyKey)
  const payment = await recordPayment(id, input, key, user)
  return { ...(await getInvoice(id))!, payment }
})
