import { payLinkQuerySchema } from '#shared/schemas/payments'

// The link and QR code a mechanic shows the driver of a card customer: a mechanic reaches only
// their own calls, and learns only whether money is due, how much, and where to pay it.
export default defineEventHandler(async (event) => {
  const { callId } = await getValidatedQuery(event, validateWith(payLinkQuerySchema))
  await requireCallAccess(event, callId)
  return payLinkForCall(callId)
})
