import { payTokenParamsSchema } from '#shared/schemas/payments'

// The payer's page, opened from the invoice e-mail or the mechanic's QR code without an account:
// the unguessable token is the key, and the answer holds only what the payer needs to pay.
export default defineEventHandler(async (event) => {
  const { token } = await getValidatedRouterParams(event, validateWith(payTokenParamsSchema))
  setResponseHeader(event, 'cache-control', 'no-store')
  return payPageOf(token)
})
