import { customerListQuerySchema } from '#shared/schemas/customers'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'dispatcher', 'office', 'admin')
  const query = await getValidatedQuery(event, validateWith(customerListQuerySchema))
  return listCustomers(query)
})
