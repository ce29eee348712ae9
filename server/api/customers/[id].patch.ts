import { customerPatchSchema } from '#shared/schemas/customers'
import { idParamsSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'dispatcher', 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const patch = await readValidatedBody(event, validateWith(customerPatchSchema))
  const customer = await updateCustomer(id, patch)
  if (!customer) throw createError({ status: 404, statusText: 'Customer not found' })
  return customer
})
