import { customerCreateSchema } from '#shared/schemas/customers'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'dispatcher', 'office', 'admin')
  const input = await readValidatedBody(event, validateWith(customerCreateSchema))
  const customer = await createCustomer(useDb(), input)
  setResponseStatus(event, 201)
  return customer
})
