import { payTokenParamsSchema } from '#shared/schemas/payments'

// Opens the payment service's hosted page for what is due now (one open page per invoice).
export default defineEventHandler(async (event) => {
  const { token } = await getValidatedRouterParams(event, validateWith(payTokenParamsSchema))
  return openCheckout(token)
})
