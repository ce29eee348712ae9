import { ratesSchema } from '#shared/schemas/rates'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'admin')
  const input = await readValidatedBody(event, validateWith(ratesSchema))
  const rates = await setRates(input)
  setResponseStatus(event, 201)
  return { rates }
})
