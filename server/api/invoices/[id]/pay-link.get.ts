import { idParamsSchema } from '#shared/schemas/users'

// The payer's link for the office to copy into a message; it works once the invoice is sent.
export default defineEventHandler(async (event) => {
  await requireRole(event, 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const token = await ensurePayToken(id)
  return { url: payUrl(token), ...(await payPageOf(token)) }
})
